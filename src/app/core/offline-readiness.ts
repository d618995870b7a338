import { Injectable, isDevMode, signal } from '@angular/core';
import { missingUrls, prefetchedUrls } from './shell-manifest';

export type OfflineState =
  /** Still finding out. */
  | 'checking'
  /** The worker is still downloading the shell. */
  | 'caching'
  /** Every shell file is in the worker's cache: the app starts with no network. */
  | 'ready'
  /** A development build: no service worker, so no offline start. */
  | 'dev-build'
  /** This browser cannot keep the app offline. */
  | 'unsupported';

const pollMs = 1000;
const maxPolls = 300;

/**
 * Watches the service worker until it controls the page and holds every file ngsw.json lists for
 * prefetch, so an official knows before leaving the hut whether the app will open on the mountain.
 */
@Injectable({ providedIn: 'root' })
export class OfflineReadiness {
  private readonly stateSignal = signal<OfflineState>('checking');
  readonly state = this.stateSignal.asReadonly();
  /** Shell files still missing from the cache, for the diagnostics line. */
  readonly missingCount = signal(0);

  constructor() {
    void this.watch();
  }

  private async watch(): Promise<void> {
    if (isDevMode()) {
      this.stateSignal.set('dev-build');
      return;
    }
    if (typeof navigator === 'undefined' || !('serviceWorker' in navigator) || typeof caches === 'undefined') {
      this.stateSignal.set('unsupported');
      return;
    }
    await navigator.serviceWorker.ready;
    for (let poll = 0; poll < maxPolls; poll++) {
      if (navigator.serviceWorker.controller && (await this.shellIsCached())) {
        this.stateSignal.set('ready');
        return;
      }
      this.stateSignal.set('caching');
      await new Promise((resolve) => setTimeout(resolve, pollMs));
    }
  }

  private async shellIsCached(): Promise<boolean> {
    let manifest: unknown;
    try {
      const response = await fetch(`ngsw.json?ngsw-cache-bust=${Date.now()}`, {
        headers: { 'ngsw-bypass': 'true' },
        cache: 'no-store',
      });
      if (!response.ok) return false;
      manifest = await response.json();
    } catch {
      // No network: the page is running, under a controlling worker, from that worker's cache.
      return true;
    }
    const missing = await missingUrls(prefetchedUrls(manifest), async (url) => (await caches.match(url)) !== undefined);
    this.missingCount.set(missing.length);
    return missing.length === 0;
  }
}
