import { DOCUMENT, DestroyRef, Injectable, InjectionToken, computed, inject, signal } from '@angular/core';
import { SwUpdate } from '@angular/service-worker';
import { filter } from 'rxjs';
import { ServerReachability } from '../../auth/server-reachability';
import { DeviceStore, type DeviceDbState } from './device-store';

/** document.location.reload(), behind a token so specs can see whether the app would reload. */
export const RELOAD_PAGE = new InjectionToken<() => void>('ReloadPage', {
  providedIn: 'root',
  factory: () => {
    const document = inject(DOCUMENT);
    return () => document.location.reload();
  },
});

const checkEveryMs = 30 * 60_000;

/**
 * Why reloading into a new version must wait, or null when it may go now. The outbox may hold the only
 * copy of a morning's readings and a new version may upgrade the database, so it waits until they are
 * sent, and until no check is open on a screen.
 */
export function reloadWaitReason(dbState: DeviceDbState, pendingCount: number | null, openChecks: number): string | null {
  // With no database there is nothing here a reload could harm, and a reload may cure it.
  if (dbState === 'failed') return null;
  if (pendingCount === null) return 'checking this device for unsent records';
  if (pendingCount > 0) return `sync first: ${pendingCount} ${pendingCount === 1 ? 'record' : 'records'} only on this device`;
  if (openChecks > 0) return `finish the open ${openChecks === 1 ? 'check' : 'checks'} first`;
  return null;
}

/**
 * Why reloading a damaged app (the worker's cached files are broken) must wait, or null when it may go
 * now: the same reasons as an update, and a signal, because the broken files must come from the server
 * again and a reload without one shows the browser's offline page instead of the app.
 */
export function damagedReloadWaitReason(
  dbState: DeviceDbState,
  pendingCount: number | null,
  openChecks: number,
  isOffline: boolean,
): string | null {
  return reloadWaitReason(dbState, pendingCount, openChecks) ?? (isOffline ? 'needs a signal to fetch the app again' : null);
}

/**
 * A new app version downloaded by the service worker: offered, never forced. Reloading (as the Angular
 * docs advise, rather than activateUpdate) happens only when the official taps and nothing is at risk.
 * A damaged version (the worker's "unrecoverable state") is announced the same way, never reloaded alone.
 */
@Injectable({ providedIn: 'root' })
export class AppUpdate {
  private readonly updates = inject(SwUpdate, { optional: true });
  private readonly store = inject(DeviceStore);
  private readonly reloadPage = inject(RELOAD_PAGE);
  private readonly window = inject(DOCUMENT).defaultView;
  private readonly destroyRef = inject(DestroyRef);
  private readonly reachability = inject(ServerReachability);

  private readonly ready = signal(false);
  /** A new version is downloaded and waits for a reload. */
  readonly isReady = this.ready.asReadonly();
  readonly waitReason = computed(() => reloadWaitReason(this.store.dbState(), this.store.pendingCount(), this.store.openChecks()));

  private readonly damage = signal<string | null>(null);
  /**
   * The service worker's reason when the version serving this tab is broken beyond repair (e.g. the
   * browser evicted some of its cached files); null while the app is whole. It stays set until a reload.
   */
  readonly damageReason = this.damage.asReadonly();
  readonly damagedWaitReason = computed(() =>
    damagedReloadWaitReason(
      this.store.dbState(),
      this.store.pendingCount(),
      this.store.openChecks(),
      this.reachability.isOffline() || this.store.status()?.online === false,
    ),
  );

  start(): void {
    const updates = this.updates;
    if (!updates?.isEnabled) return;
    const subscription = updates.versionUpdates.pipe(filter((event) => event.type === 'VERSION_READY')).subscribe(() => this.ready.set(true));
    // Never reloaded by itself: the outbox may hold the only copy of the records (see damagedWaitReason).
    subscription.add(updates.unrecoverable.subscribe((event) => this.damage.set(event.reason || 'no reason given')));
    // The worker checks at each start by itself; a device that stays open all day checks now and then.
    const check = () => void updates.checkForUpdate().catch(() => undefined);
    const timer = setInterval(check, checkEveryMs);
    this.window?.addEventListener('online', check);
    this.destroyRef.onDestroy(() => {
      subscription.unsubscribe();
      clearInterval(timer);
      this.window?.removeEventListener('online', check);
    });
  }

  /** Reloads into the new version; refuses (false) while records wait or a check is open. */
  updateNow(): boolean {
    if (!this.ready() || this.waitReason() !== null) return false;
    this.reloadPage();
    return true;
  }

  /** Reloads a damaged app; refuses (false) while records are only on this device, a check is open or there is no signal. */
  reloadDamaged(): boolean {
    if (this.damage() === null || this.damagedWaitReason() !== null) return false;
    this.reloadPage();
    return true;
  }

  /** Another tab upgraded the database: this tab cannot save any more until it reloads. */
  reloadForNewerTab(): void {
    this.reloadPage();
  }
}
