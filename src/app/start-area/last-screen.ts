import { DestroyRef, Injectable, inject } from '@angular/core';
import { NavigationEnd, Router } from '@angular/router';
import { filter, take } from 'rxjs';
import { z } from 'zod';
import { forget, keep, readKept } from '../auth/local-json';

const lastScreenKey = 'rimelog.last-entry-screen';
/** Older than this, the screen is from another session of work and the app opens at home as usual. */
const restoreWithinMs = 12 * 60 * 60_000;
const lastScreenSchema = z.object({ url: z.string().startsWith('/competitions/'), at: z.number() });

/**
 * Where an official was recording when the app was killed (a dead battery, the system closing it): the
 * entry screens remember themselves while shown and forget on leaving normally, so a kept entry means
 * the app did not close the usual way, and the next start opens that screen again.
 */
@Injectable({ providedIn: 'root' })
export class LastScreen {
  private readonly router = inject(Router);

  /** Call from an entry screen's constructor (the address is known once the navigation to it ends). */
  rememberWhileShown(): void {
    const shown = this.router.events.pipe(filter((event) => event instanceof NavigationEnd), take(1)).subscribe((end) => {
      keep(lastScreenKey, { url: end.urlAfterRedirects, at: Date.now() });
    });
    inject(DestroyRef).onDestroy(() => {
      shown.unsubscribe();
      forget(lastScreenKey);
    });
  }

  /** The screen to reopen at app start, if the app was killed on one recently. */
  toRestore(now = Date.now()): string | null {
    const kept = readKept(lastScreenKey, lastScreenSchema);
    return kept && now - kept.at <= restoreWithinMs ? kept.url : null;
  }

  /** At start, on the home screen only: an address typed or a link followed always wins. */
  async restoreAtStart(): Promise<boolean> {
    const url = this.toRestore();
    if (!url || (this.router.url !== '/' && this.router.url !== '')) return false;
    return this.router.navigateByUrl(url);
  }
}
