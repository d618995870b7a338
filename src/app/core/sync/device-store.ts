import { DestroyRef, Injectable, Injector, computed, effect, inject, signal, untracked } from '@angular/core';
import { Subscription, from, switchMap, type Observable } from 'rxjs';
import type { Area } from '../../../../shared/auth/roles';
import type { FieldData } from '../../../../shared/competition/field-data';
import type { PhotoPurpose, RecordKind } from '../../../../shared/sync/record-kinds';
import { AuthStore } from '../../auth/auth-store';
import { deviceId } from '../../auth/device-id';
import type { LocalRecord, Rejection } from '../device-store/device-db';
import type { KeepFieldDataResult } from '../device-store/field-data';
import type { RecordWriter, WriteResult } from '../device-store/record-writer';
import { isQuotaError, RecordRefusedError, StorageFullError } from '../device-store/store-errors';
import type { RoundResult, SyncStatus } from '../device-store/sync-engine';
import type { DeviceRuntime } from './device-runtime';
import { DEVICE_STORE_BACKEND } from './device-store-backend';
import { emptyOutboxSummary, type OutboxSummary } from './outbox-summary';
import { StorageGuard } from './storage-guard';

export type DeviceDbState = 'opening' | 'open' | 'failed';

/** The device database could not be opened, so nothing can be saved or sent from this browser. */
export class DeviceStoreUnavailableError extends Error {
  override readonly name = 'DeviceStoreUnavailableError';
}

/**
 * The app's one door to the records on this device: opens the device database once (at app start, so
 * the outbox is known even before sign-in), syncs while an official is signed in, and stamps every
 * record with the official using the device now. Every write wakes the sync loop; a full disk raises
 * the storage banner and is rethrown, never swallowed.
 */
@Injectable({ providedIn: 'root' })
export class DeviceStore {
  private readonly auth = inject(AuthStore);
  private readonly storage = inject(StorageGuard);
  private readonly backend = inject(DEVICE_STORE_BACKEND);
  private readonly injector = inject(Injector);

  readonly deviceId = deviceId();
  private readonly state = signal<DeviceDbState>('opening');
  readonly dbState = this.state.asReadonly();
  private readonly problem = signal<string | null>(null);
  /** Why the device database could not be opened, in words. */
  readonly openProblem = this.problem.asReadonly();
  private readonly engineStatus = signal<SyncStatus | null>(null);
  /** The sync engine's status (null until the database is open). */
  readonly status = this.engineStatus.asReadonly();
  /** Records only on this device, or null while that is not known yet. */
  readonly pendingCount = computed(() => this.engineStatus()?.pendingCount ?? null);
  readonly lastSyncAt = computed(() => this.engineStatus()?.lastSyncAt ?? null);
  private readonly waiting = signal<OutboxSummary>(emptyOutboxSummary);
  readonly outbox = this.waiting.asReadonly();
  private readonly refused = signal<readonly Rejection[]>([]);
  readonly rejections = this.refused.asReadonly();
  /**
   * Checks open on a screen right now. The start-area screens count them up and down; an app update
   * never reloads while one is open.
   */
  readonly openChecks = signal(0);
  private readonly replaced = signal(false);
  /** Another tab opened a newer version of the database; this tab must reload to go on saving. */
  readonly replacedByNewerTab = this.replaced.asReadonly();
  private readonly running = signal(false);
  /** The sync loop runs (an official is signed in and the database is open). */
  readonly isRunning = this.running.asReadonly();

  private opening: Promise<DeviceRuntime | null> | null = null;
  private opened: DeviceRuntime | null = null;
  private readonly subscriptions = new Subscription();
  private started = false;

  /** Opens the database, then follows sign-in: sync runs while someone is signed in on this device. */
  start(): void {
    if (this.started) return;
    this.started = true;
    void this.open().then(() => this.storage.check());
    effect(
      () => {
        const signedIn = this.auth.isSignedIn();
        untracked(() => (signedIn ? void this.resume() : this.pause()));
      },
      { injector: this.injector },
    );
    effect(
      () => {
        if (this.lastSyncAt() !== null) untracked(() => void this.storage.check());
      },
      { injector: this.injector },
    );
    this.injector.get(DestroyRef).onDestroy(() => {
      this.pause();
      this.subscriptions.unsubscribe();
      this.opened?.db.close();
    });
  }

  /** Runs a sync round now (the sync screen's "Sync now"), then looks at storage again. */
  async syncNow(): Promise<RoundResult> {
    const { engine } = await this.ready();
    const result = await engine.syncNow();
    await this.storage.check();
    return result;
  }

  /** Every unsent change as one file's contents, named by device and time. */
  async exportBackup(): ReturnType<DeviceRuntime['exportBackup']> {
    return (await this.ready()).exportBackup();
  }

  /**
   * Adds a backup's changes to the outbox unchanged (same op ids), so the server answers any it already
   * has as duplicates: importing a file twice changes nothing there.
   */
  async importBackup(contents: string): ReturnType<DeviceRuntime['importBackup']> {
    const runtime = await this.ready();
    try {
      const result = await runtime.importBackup(contents);
      if (result.added + result.recordsAdded > 0) this.storage.noteWriteSaved();
      if (result.added > 0) runtime.engine.nudge();
      return result;
    } catch (error) {
      if (error instanceof StorageFullError) this.storage.noteStorageFull();
      throw error;
    }
  }

  /** Puts a refusal away (the values stay on the device, marked with who did it and when). */
  async dismissRejection(opId: string): Promise<void> {
    const runtime = await this.ready();
    const user = this.auth.activeUserId();
    if (user === null) throw new RecordRefusedError('Sign in first: putting a refusal away says who did it.');
    await runtime.dismissRejection(opId, user);
  }

  /**
   * Keeps a photo or certificate for the record `of`: scaled to 1600 px JPEG on this device, then saved with
   * its photo record in one transaction. It is uploaded after that record has reached the server.
   */
  async attachPhoto(of: string, file: Blob, purpose: PhotoPurpose, caption = ''): Promise<WriteResult> {
    const prepared = await (await import('../photos/prepare-photo')).preparePhoto(file);
    return this.write((writer, user) => writer.attachPhoto(of, prepared, { purpose, caption }, user));
  }

  /**
   * Keeps a PNG or PDF exactly as given (a signature must not be resized or re-encoded), with its photo
   * record for the record `of`, in one transaction; uploaded like any photo.
   */
  async attachFileAsIs(of: string, file: Blob, purpose: PhotoPurpose, caption = ''): Promise<WriteResult> {
    const kept = await (await import('../photos/prepare-photo')).keepFileAsIs(file);
    return this.write((writer, user) => writer.attachPhoto(of, kept, { purpose, caption }, user));
  }

  /** The records of one kind in a competition, as this device sees them; updates itself after every change. */
  watchRecords(competitionId: string, kind: RecordKind): Observable<LocalRecord[]> {
    return from(this.ready()).pipe(switchMap((runtime) => runtime.watchRecords(competitionId, kind)));
  }

  /** This device's copy of a competition's start list, instruments, officials and rules; null while it has none. */
  fieldData(competitionId: string): Observable<FieldData | null> {
    return from(this.ready()).pipe(switchMap((runtime) => runtime.watchFieldData(competitionId)));
  }

  /** Replaces the competition's copy with the server's answer when it parses; a full disk raises the storage banner. */
  async keepFieldData(answer: unknown): Promise<KeepFieldDataResult> {
    const runtime = await this.ready();
    try {
      return await runtime.keepFieldData(answer);
    } catch (error) {
      if (isQuotaError(error)) this.storage.noteStorageFull();
      throw error;
    }
  }

  /**
   * An address to show a photo from: its bytes on this device, or else the server's copy (a photo taken on
   * another device). Revoke a blob: address with URL.revokeObjectURL when it leaves the screen.
   */
  async photoUrl(sha256: string, mediaType: string): Promise<string> {
    const bytes = await (await this.ready()).photoBytes(sha256);
    return bytes ? URL.createObjectURL(new Blob([bytes], { type: mediaType })) : `/api/uploads/${sha256}`;
  }

  createRecord(kind: RecordKind, competitionId: string, area: Area, fields: Record<string, unknown>): Promise<WriteResult> {
    return this.write((writer, user) => writer.createRecord(kind, competitionId, area, fields, user));
  }

  updateRecord(id: string, changes: Record<string, unknown>): Promise<WriteResult> {
    return this.write((writer, user) => writer.updateRecord(id, changes, user));
  }

  deleteRecord(id: string): Promise<WriteResult> {
    return this.write((writer, user) => writer.deleteRecord(id, user));
  }

  correctRecord(id: string, newFields: Record<string, unknown>, reason: string): Promise<WriteResult> {
    return this.write((writer, user) => writer.correctRecord(id, newFields, reason, user));
  }

  settleConflict(conflictId: string, value: unknown, reason: string): Promise<WriteResult> {
    return this.write((writer, user) => writer.settleConflict(conflictId, value, reason, user));
  }

  private async write(change: (writer: RecordWriter, user: string) => Promise<WriteResult>): Promise<WriteResult> {
    const { writer } = await this.ready();
    const user = this.auth.activeUserId();
    if (user === null) throw new RecordRefusedError('Sign in before recording: every record says who made it.');
    try {
      const result = await change(writer, user);
      if (result.op) this.storage.noteWriteSaved();
      return result;
    } catch (error) {
      if (error instanceof StorageFullError) this.storage.noteStorageFull();
      throw error;
    }
  }

  private async ready(): Promise<DeviceRuntime> {
    const opened = await this.open();
    if (!opened) throw new DeviceStoreUnavailableError(this.problem() ?? 'The records on this device cannot be opened.');
    return opened;
  }

  private open(): Promise<DeviceRuntime | null> {
    this.opening ??= this.openOnce();
    return this.opening;
  }

  private async openOnce(): Promise<DeviceRuntime | null> {
    let start: typeof import('./device-runtime').startDeviceRuntime;
    try {
      start = (await import('./device-runtime')).startDeviceRuntime;
    } catch {
      return this.fail('Part of the app is missing on this device, so records cannot be opened. Reload where there is a signal.');
    }
    let runtime: DeviceRuntime;
    try {
      runtime = start(await this.backend.openDb(this.deviceId, () => this.replaced.set(true)), this.backend);
    } catch (error) {
      if (isQuotaError(error)) this.storage.noteStorageFull();
      return this.fail(describeOpenFailure(error));
    }
    this.subscriptions.add(runtime.engine.status$.subscribe((status) => this.engineStatus.set(status)));
    this.subscriptions.add(runtime.outbox$.subscribe((summary) => this.waiting.set(summary)));
    this.subscriptions.add(runtime.rejections$.subscribe((rejections) => this.refused.set(rejections)));
    this.opened = runtime;
    this.state.set('open');
    return runtime;
  }

  private fail(problem: string): null {
    this.problem.set(problem);
    this.state.set('failed');
    return null;
  }

  private async resume(): Promise<void> {
    const opened = await this.open();
    if (!opened || !this.auth.isSignedIn() || this.running()) return;
    opened.engine.start();
    this.running.set(true);
    await this.storage.firstUse();
  }

  private pause(): void {
    this.opened?.engine.stop();
    this.running.set(false);
  }
}

function describeOpenFailure(error: unknown): string {
  if (isQuotaError(error)) {
    return 'This device is out of storage, so its records cannot be opened. Free some space on the device, then reload.';
  }
  const name = error instanceof Error ? error.name : 'unknown';
  return `This browser will not keep records on this device (a private window, or site storage switched off?), so nothing can be saved here. Use the installed app or another browser. (${name})`;
}
