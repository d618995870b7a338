import { InjectionToken } from '@angular/core';

export interface StorageNumbers {
  usage: number;
  quota: number;
}

/** The browser's storage manager, narrowed to what the app asks; null means the browser gives no answer. */
export interface BrowserStorage {
  persisted(): Promise<boolean | null>;
  persist(): Promise<boolean | null>;
  estimate(): Promise<StorageNumbers | null>;
  /** Writes and removes a small row: true only when the browser took it, i.e. there is room again. */
  hasRoomForWrite(): Promise<boolean>;
}

export const BROWSER_STORAGE = new InjectionToken<BrowserStorage>('BrowserStorage', {
  providedIn: 'root',
  factory: browserStorage,
});

function browserStorage(): BrowserStorage {
  const manager = typeof navigator !== 'undefined' ? navigator.storage : undefined;
  return {
    persisted: async () => (manager?.persisted ? manager.persisted().catch(() => null) : null),
    persist: async () => (manager?.persist ? manager.persist().catch(() => null) : null),
    estimate: async () => {
      if (!manager?.estimate) return null;
      try {
        const { usage, quota } = await manager.estimate();
        return usage !== undefined && quota ? { usage, quota } : null;
      } catch {
        return null;
      }
    },
    hasRoomForWrite: probeSpace,
  };
}

const probeBytes = 256 * 1024;

/**
 * Space is per origin, so a write to a database of its own tells whether the records' database has room,
 * without touching it: after a quota error Firefox may leave the database that failed wedged until reopened.
 */
async function probeSpace(): Promise<boolean> {
  const { Dexie } = await import('dexie');
  const db = new Dexie('rimelog-space-probe');
  db.version(1).stores({ probe: 'key' });
  try {
    // The transaction's promise, not the put's: in Chrome the single operation may never settle on a full disk.
    await db.transaction('rw', db.table('probe'), async () => {
      await db.table('probe').put({ key: 'probe', filler: 'x'.repeat(probeBytes) });
    });
    await db.table('probe').delete('probe');
    return true;
  } catch {
    return false;
  } finally {
    db.close();
  }
}
