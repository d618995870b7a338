import { liveQuery } from 'dexie';
import { BehaviorSubject, NEVER, Subject, Subscription, combineLatest, defer, from, fromEvent, map, merge, race, repeat, retry, shareReplay, take, timer, type Observable } from 'rxjs';
import { clockOffsetMs, clockWarningMs } from '../../../../shared/sync/hybrid-clock';
import { backoffDelayMs, defaultBackoff, type BackoffPolicy } from './backoff';
import { isShownRejection, readSyncState, syncStateKey, type DeviceDb, type SyncState } from './device-db';
import { pullChanges } from './pull-changes';
import { emptyPushSummary, pushOutbox, type PushSummary } from './push-outbox';
import { SyncTransportError, type SyncTransport } from './sync-transport';
import { emptyPhotoUploadSummary, uploadWaitingPhotos, type PhotoUploadSummary, type UploadTransport } from './upload-photos';

export interface SyncStatus {
  /** The server answered the last heartbeat; null before the first try. */
  online: boolean | null;
  syncing: boolean;
  /** Records with changes only on this device (waiting in the outbox). */
  pendingCount: number;
  /** Changes the server refused, kept with their reasons for the official. */
  rejectedCount: number;
  openConflicts: number;
  lastSyncAt: string | null;
  /** What went wrong in the last round, in words; null after a good round. */
  lastError: string | null;
  /** Device clock minus server clock in ms (+ = device ahead), from the last heartbeat. */
  clockOffsetMs: number | null;
  /** Set when the device clock is more than 2 minutes off. */
  clockWarning: string | null;
  /** Photo and certificate files not uploaded yet. */
  photosWaiting: number;
  /** Why the oldest waiting file failed last time, in words; null when none failed. */
  photoError: string | null;
}

export interface RoundResult {
  ok: boolean;
  /** Another tab held the sync lock, so this one did nothing. */
  skipped: boolean;
  pushed: PushSummary;
  pulledChanges: number;
  photos: PhotoUploadSummary;
  error: string | null;
}

export interface SyncEngineOptions {
  db: DeviceDb;
  transport: SyncTransport;
  /** Where photo files go; without it they wait on the device. */
  uploads?: UploadTransport;
  now?: () => number;
  random?: () => number;
  /** The wait between rounds while all is well. */
  intervalMs?: number;
  backoff?: BackoffPolicy;
  /** Reconnect events; by default the window's `online` event. */
  online$?: Observable<unknown>;
  /** Runs a round under a lock shared by the tabs of this app, or answers null when another tab holds it. */
  lock?: <T>(round: () => Promise<T>) => Promise<T | null>;
}

export type SyncEngine = ReturnType<typeof createSyncEngine>;

interface EngineMemory {
  online: boolean | null;
  syncing: boolean;
  /** undefined until this engine has finished a round: then the stored error is shown. */
  lastError: string | null | undefined;
  clockOffsetMs: number | null;
}

/**
 * The sync loop: a round is heartbeat → push the outbox → pull every page. Rounds run on a timer, with
 * exponential backoff and jitter after failures, at once on reconnect and after a local write, and
 * never two at a time (in this tab by a shared promise, across tabs by a Web Lock).
 */
export function createSyncEngine(options: SyncEngineOptions) {
  const { db, transport } = options;
  const now = options.now ?? (() => Date.now());
  const random = options.random ?? Math.random;
  const intervalMs = options.intervalMs ?? 60_000;
  const backoff = options.backoff ?? defaultBackoff;
  const online$ = options.online$ ?? (typeof window !== 'undefined' ? fromEvent(window, 'online') : NEVER);
  const lock = options.lock ?? webLock;

  const memory = new BehaviorSubject<EngineMemory>({ online: null, syncing: false, lastError: undefined, clockOffsetMs: null });
  const nudges = new Subject<void>();
  const wake$ = merge(nudges, online$);
  let failures = 0;
  let inFlight: Promise<RoundResult> | null = null;
  /** A wake-up (write, reconnect, sync request) arrived while a round ran: run again right after. */
  let wokenDuringRound = false;
  let loop: Subscription | null = null;

  // A failed read ends a liveQuery; start it again so the status strip never freezes.
  const stored$ = from(liveQuery(() => readStoredStatus(db))).pipe(retry({ delay: 2_000 }));
  const status$: Observable<SyncStatus> = combineLatest([memory, stored$]).pipe(
    map(([m, s]): SyncStatus => ({
      online: m.online,
      syncing: m.syncing,
      pendingCount: s.pendingCount,
      rejectedCount: s.rejectedCount,
      openConflicts: s.openConflicts,
      lastSyncAt: s.state.lastSyncAt,
      lastError: m.lastError !== undefined ? m.lastError : s.state.lastError,
      clockOffsetMs: m.clockOffsetMs,
      clockWarning: m.clockOffsetMs !== null && Math.abs(m.clockOffsetMs) > clockWarningMs ? clockWords(m.clockOffsetMs) : null,
      photosWaiting: s.photosWaiting,
      photoError: s.photoError,
    })),
    shareReplay({ bufferSize: 1, refCount: true }),
  );

  function update(change: Partial<EngineMemory>): void {
    memory.next({ ...memory.value, ...change });
  }

  async function round(): Promise<RoundResult> {
    update({ syncing: true });
    let heartbeatAnswered = false;
    let pushed = emptyPushSummary();
    try {
      const sentAt = now();
      const { serverTime } = await transport.heartbeat();
      heartbeatAnswered = true;
      update({ online: true, clockOffsetMs: clockOffsetMs(Date.parse(serverTime), sentAt, now()) });
      pushed = await pushOutbox(db, transport, { now });
      const pulled = await pullChanges(db, transport, { now });
      failures = 0;
      await keepOutcome({ lastSyncAt: new Date(now()).toISOString(), lastError: null });
      const photos = await uploadPhotos();
      update({ syncing: false, lastError: null });
      return { ok: true, skipped: false, pushed, pulledChanges: pulled.changes, photos, error: null };
    } catch (error) {
      failures++;
      const words = describeFailure(error);
      await keepOutcome({ lastError: words });
      update({ syncing: false, lastError: words, online: heartbeatAnswered ? memory.value.online : false });
      return { ok: false, skipped: false, pushed, pulledChanges: 0, photos: emptyPhotoUploadSummary(), error: words };
    }
  }

  /** After the records: a failing file keeps its reason on its row and never fails the round. */
  async function uploadPhotos(): Promise<PhotoUploadSummary> {
    if (!options.uploads) return emptyPhotoUploadSummary();
    try {
      return await uploadWaitingPhotos(db, options.uploads, { now });
    } catch {
      return emptyPhotoUploadSummary();
    }
  }

  async function keepOutcome(change: Partial<Pick<SyncState, 'lastSyncAt' | 'lastError'>>): Promise<void> {
    try {
      await db.syncState.update(syncStateKey, change);
    } catch {
      // The status strip still shows it from memory; the records themselves are not touched here.
    }
  }

  function syncNow(): Promise<RoundResult> {
    if (inFlight) {
      wokenDuringRound = true;
      return inFlight;
    }
    wokenDuringRound = false;
    inFlight = lock(round)
      .then(
        (result) => result ?? { ok: true, skipped: true, pushed: emptyPushSummary(), pulledChanges: 0, photos: emptyPhotoUploadSummary(), error: null },
        // Only the lock itself can fail here (round() catches its own errors); the loop must live on.
        (error: unknown) => {
          failures++;
          return { ok: false, skipped: false, pushed: emptyPushSummary(), pulledChanges: 0, photos: emptyPhotoUploadSummary(), error: describeFailure(error) };
        },
      )
      .finally(() => {
        inFlight = null;
      });
    return inFlight;
  }

  function nextDelayMs(): number {
    return failures === 0 ? intervalMs : backoffDelayMs(failures, random, backoff);
  }

  return {
    status$,
    syncNow,
    nextDelayMs,
    /** Failed rounds in a row (0 after a good one). */
    failures: () => failures,
    /** A local write was committed: sync soon. */
    nudge(): void {
      nudges.next();
    },
    start(): void {
      if (loop) return;
      loop = new Subscription();
      loop.add(
        wake$.subscribe(() => {
          if (inFlight) wokenDuringRound = true;
        }),
      );
      loop.add(
        defer(() => from(syncNow()))
          .pipe(
            repeat({
              delay: () => (wokenDuringRound ? timer(0) : race(timer(nextDelayMs()), wake$.pipe(take(1)))),
            }),
          )
          .subscribe(),
      );
    },
    stop(): void {
      loop?.unsubscribe();
      loop = null;
    },
  };
}

async function readStoredStatus(db: DeviceDb) {
  return {
    pendingCount: (await db.outbox.orderBy('recordId').uniqueKeys()).length,
    rejectedCount: await db.rejections.filter(isShownRejection).count(),
    openConflicts: await db.conflicts
      .where('status')
      .equals('open')
      .filter((c) => c.localSettlement === null)
      .count(),
    state: await readSyncState(db),
    ...(await readPhotoQueue(db)),
  };
}

async function readPhotoQueue(db: DeviceDb): Promise<{ photosWaiting: number; photoError: string | null }> {
  const waiting = await db.photos.where('upload').equals('waiting').primaryKeys();
  const failed = await db.photos
    .where('upload')
    .equals('waiting')
    .filter((photo) => photo.lastError !== null)
    .first();
  return { photosWaiting: waiting.length, photoError: failed?.lastError ?? null };
}

function describeFailure(error: unknown): string {
  if (error instanceof SyncTransportError) return error.message;
  if (error instanceof Error && error.name === 'StorageFullError') return error.message;
  const detail = error instanceof Error ? error.message : String(error);
  return `Sync stopped on this device (${detail}). Records stay here; the device tries again.`;
}

function clockWords(offsetMs: number): string {
  const minutes = Math.round(Math.abs(offsetMs) / 60_000);
  const direction = offsetMs > 0 ? 'ahead of' : 'behind';
  return `This device's clock is about ${minutes} min ${direction} the server. Set the right time in the device settings; records keep their order either way.`;
}

/** One syncing tab per browser: the others skip their round while it runs. */
function webLock<T>(round: () => Promise<T>): Promise<T | null> {
  const locks = typeof navigator !== 'undefined' ? navigator.locks : undefined;
  if (!locks) return round();
  return locks.request('rimelog-sync', { ifAvailable: true }, (held) => (held ? round() : null)) as Promise<T | null>;
}
