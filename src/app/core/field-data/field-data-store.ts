import { HttpClient, HttpErrorResponse } from '@angular/common/http';
import { Injectable, Injector, computed, effect, inject, signal, untracked, type Signal } from '@angular/core';
import { catchError, firstValueFrom, of, type Observable } from 'rxjs';
import type { FieldData } from '../../../../shared/competition/field-data';
import { AuthStore } from '../../auth/auth-store';
import { describeLoadError } from '../describe-load-error';
import { isQuotaError } from '../device-store/store-errors';
import { DeviceStore, DeviceStoreUnavailableError } from '../sync/device-store';

/** Why the last refresh of one competition's field data failed, in words; the kept copy stays in use. */
export interface FieldDataFailure {
  competitionId: string;
  message: string;
  /** When it failed (device clock, ISO). */
  at: string;
}

export type FieldDataRefresh = { ok: true } | { ok: false; failure: FieldDataFailure };

const copyStays = 'The start list and instruments already on this device stay in use.';

export const fieldDataUrl = (competitionId: string) => `/api/competitions/${encodeURIComponent(competitionId)}/field-data`;

/**
 * The start list, instruments, officials and frozen rules of each competition, kept on the device so the
 * start area works with no signal. Refreshed from the server when a screen asks and, once started, for
 * every competition the official using the device holds a role in whenever a sync round succeeds.
 * Nothing here throws at a screen: a failed refresh keeps the stored copy and says why in `failureFor`.
 */
@Injectable({ providedIn: 'root' })
export class FieldDataStore {
  private readonly http = inject(HttpClient);
  private readonly device = inject(DeviceStore);
  private readonly auth = inject(AuthStore);
  private readonly injector = inject(Injector);

  private readonly failures = signal<ReadonlyMap<string, FieldDataFailure>>(new Map());
  /** The newest failure of any competition that has not refreshed well since; null when none. */
  readonly lastFailure = computed(() =>
    [...this.failures().values()].reduce<FieldDataFailure | null>((newest, f) => (newest === null || f.at > newest.at ? f : newest), null),
  );
  /**
   * The competitions refreshed after each sync round: those the official using the device holds a role
   * in. An organiser of every competition names none; their screens ask for the one they show.
   */
  readonly competitionIds = computed(
    () => [...new Set(this.auth.roles().flatMap((r) => (r.competitionId === null ? [] : [r.competitionId])))].sort(),
    { equal: (a, b) => a.length === b.length && a.every((id, i) => id === b[i]) },
  );
  private readonly inFlight = new Map<string, Promise<FieldDataRefresh>>();
  private started = false;

  /** Refreshes every competition of the official after each successful sync round (and when the official changes). */
  start(): void {
    if (this.started) return;
    this.started = true;
    effect(
      () => {
        const syncedAt = this.device.lastSyncAt();
        const ids = this.competitionIds();
        if (syncedAt === null) return;
        untracked(() => ids.forEach((id) => void this.refresh(id)));
      },
      { injector: this.injector },
    );
  }

  /** This device's copy of the competition's field data (null while it has none), updated whenever it is replaced. */
  watch(competitionId: string): Observable<FieldData | null> {
    this.start();
    return this.device.fieldData(competitionId).pipe(
      catchError((error: unknown) => {
        this.fail(competitionId, error instanceof Error ? error.message : 'The records on this device cannot be opened.');
        return of(null);
      }),
    );
  }

  /** The last failure for this competition, or null once a refresh has gone well. */
  failureFor(competitionId: string): Signal<FieldDataFailure | null> {
    return computed(() => this.failures().get(competitionId) ?? null);
  }

  /** Fetches the competition's field data and keeps it; never rejects. Two calls at once share one request. */
  refresh(competitionId: string): Promise<FieldDataRefresh> {
    this.start();
    const running = this.inFlight.get(competitionId);
    if (running) return running;
    const refreshing = this.fetchAndKeep(competitionId).finally(() => this.inFlight.delete(competitionId));
    this.inFlight.set(competitionId, refreshing);
    return refreshing;
  }

  private async fetchAndKeep(competitionId: string): Promise<FieldDataRefresh> {
    let answer: unknown;
    try {
      answer = await firstValueFrom(this.http.get(fieldDataUrl(competitionId), { headers: { 'ngsw-bypass': 'true' } }));
    } catch (error) {
      return this.fail(competitionId, `${describeFetchFailure(error)} ${copyStays}`);
    }
    try {
      const result = await this.device.keepFieldData(answer);
      if (!result.kept) return this.fail(competitionId, result.problem);
    } catch (error) {
      return this.fail(competitionId, `${describeKeepFailure(error)} ${copyStays}`);
    }
    this.failures.update((all) => {
      const rest = new Map(all);
      rest.delete(competitionId);
      return rest;
    });
    return { ok: true };
  }

  private fail(competitionId: string, message: string): FieldDataRefresh {
    const failure: FieldDataFailure = { competitionId, message, at: new Date().toISOString() };
    this.failures.update((all) => new Map(all).set(competitionId, failure));
    return { ok: false, failure };
  }
}

function describeFetchFailure(error: unknown): string {
  // A 2xx that is not JSON came from something in between, such as a Wi-Fi login page.
  if (error instanceof HttpErrorResponse && error.status >= 200 && error.status < 300) {
    return 'Something answered, but not the Rimelog server (a Wi-Fi login page?).';
  }
  return describeLoadError(error);
}

function describeKeepFailure(error: unknown): string {
  if (isQuotaError(error)) return 'This device is out of storage, so the newest start list and instruments could not be kept.';
  if (error instanceof DeviceStoreUnavailableError) return error.message;
  return 'The newest start list and instruments could not be saved on this device.';
}
