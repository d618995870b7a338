import { Injectable, computed, inject, signal } from '@angular/core';
import { z } from 'zod';
import { keep, readKept } from '../../auth/local-json';
import { BROWSER_STORAGE } from './browser-storage';

/** kept: the browser promised not to clear it; may-clear: it may under storage pressure; unknown: it does not say. */
export type Persistence = 'kept' | 'may-clear' | 'unknown';

const askedKey = 'rimelog.storage.persist-asked';
export const nearlyFullFraction = 0.8;

/**
 * Keeps the records' storage honest: asks the browser to keep it (persist), watches how full it is, and
 * holds the "storage full" state from a refused write until the browser takes a write again.
 */
@Injectable({ providedIn: 'root' })
export class StorageGuard {
  private readonly browser = inject(BROWSER_STORAGE);

  readonly persistence = signal<Persistence>('unknown');
  readonly estimate = signal<{ usage: number; quota: number } | null>(null);
  readonly usedFraction = computed(() => {
    const numbers = this.estimate();
    return numbers && numbers.quota > 0 ? numbers.usage / numbers.quota : null;
  });
  readonly isNearlyFull = computed(() => (this.usedFraction() ?? 0) >= nearlyFullFraction);
  private readonly full = signal(false);
  /** A write was refused for lack of space and no write has been taken since. */
  readonly isFull = this.full.asReadonly();

  /**
   * At first use the browser is asked to keep the records (Firefox asks the official, so only once per
   * device); at every later start it is only asked whether it does.
   */
  async firstUse(): Promise<void> {
    let kept = await this.browser.persisted();
    if (kept !== true && !readKept(askedKey, z.literal(true))) {
      keep(askedKey, true);
      kept = await this.browser.persist();
    }
    this.persistence.set(persistenceOf(kept));
  }

  /** The official asked again (a tap lets the browser show its question). */
  async askToKeep(): Promise<void> {
    keep(askedKey, true);
    this.persistence.set(persistenceOf(await this.browser.persist()));
  }

  /** After opening and after syncs: how full storage is and, after a refused write, whether there is room again. */
  async check(): Promise<void> {
    this.estimate.set(await this.browser.estimate());
    if (this.full() && (await this.browser.hasRoomForWrite())) this.full.set(false);
  }

  noteStorageFull(): void {
    this.full.set(true);
  }

  noteWriteSaved(): void {
    this.full.set(false);
  }
}

function persistenceOf(kept: boolean | null): Persistence {
  if (kept === null) return 'unknown';
  return kept ? 'kept' : 'may-clear';
}
