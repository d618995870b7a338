import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, DestroyRef, computed, effect, inject, input, signal, untracked } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';
import { switchMap } from 'rxjs';
import type { LocalRecord } from '../../core/device-store/device-db';
import { DeviceStore } from '../../core/sync/device-store';
import { FieldCautions } from '../../ui/field-cautions';
import { LastScreen } from '../last-screen';
import { keepScreenAwake } from '../screen-awake';
import { checkRowOf, checkStatusWords, type CheckStatus } from './check-words';
import { CheckPhotos } from './check-photos';

type Outcome = Exclude<CheckStatus, 'in-progress'>;

/**
 * One sled's start check: its photos, a note, and the result. Every change is saved on this device as
 * it is made. While the check is open, an app update waits (DeviceStore.openChecks).
 */
@Component({
  selector: 'rl-start-check-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, MatButtonModule, RouterLink, FieldCautions, CheckPhotos],
  templateUrl: './start-check-page.html',
  styleUrl: './start-checks.scss',
})
export class StartCheckPage {
  private readonly store = inject(DeviceStore);
  /** The competition and the check, from the route. */
  readonly id = input.required<string>();
  readonly checkId = input.required<string>();

  private readonly records = toSignal<LocalRecord[] | null, null>(toObservable(this.id).pipe(switchMap((id) => this.store.watchRecords(id, 'start-check'))), {
    initialValue: null,
  });
  readonly check = computed(() => {
    const record = this.records()?.find((r) => r.id === this.checkId());
    return record ? checkRowOf(record) : null;
  });
  readonly isLoading = computed(() => this.records() === null);
  readonly statusWords = checkStatusWords;
  readonly confirming = signal<Outcome | null>(null);
  readonly saved = signal<string | null>(null);
  readonly problem = signal<string | null>(null);
  readonly busy = signal(false);

  readonly screenAwake = keepScreenAwake();

  constructor() {
    this.countOpenCheck();
    inject(LastScreen).rememberWhileShown();
  }

  async saveNote(note: string): Promise<void> {
    const check = this.check();
    if (!check || note === check.note) return;
    await this.save({ note }, 'Note saved on this device');
  }

  choose(outcome: Outcome): void {
    // Clearing a sled is the everyday result; the others go to the delegate, so they are asked twice.
    if (outcome === 'cleared') void this.finish(outcome);
    else this.confirming.set(outcome);
  }

  async finish(outcome: Outcome): Promise<void> {
    this.confirming.set(null);
    await this.save({ status: outcome }, `${checkStatusWords[outcome]}: saved on this device`);
  }

  async reopen(): Promise<void> {
    await this.save({ status: 'in-progress' }, 'Check open again');
  }

  private async save(changes: Record<string, unknown>, words: string): Promise<void> {
    this.busy.set(true);
    this.problem.set(null);
    try {
      await this.store.updateRecord(this.checkId(), changes);
      this.saved.set(`${words} ${new Date().toLocaleTimeString([], { hour: '2-digit', minute: '2-digit', second: '2-digit' })}`);
    } catch (error) {
      this.saved.set(null);
      this.problem.set(error instanceof Error ? error.message : String(error));
    } finally {
      this.busy.set(false);
    }
  }

  /** Counts this check as open on a screen while it is under way, so an app update never reloads over it. */
  private countOpenCheck(): void {
    let counted = false;
    const count = (open: boolean) => {
      if (open === counted) return;
      counted = open;
      this.store.openChecks.update((n) => n + (open ? 1 : -1));
    };
    effect(() => {
      const open = this.check()?.status === 'in-progress';
      untracked(() => count(open));
    });
    inject(DestroyRef).onDestroy(() => count(false));
  }
}
