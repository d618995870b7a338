import type { Provider } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { Dexie } from 'dexie';
import { IDBFactory, IDBKeyRange } from 'fake-indexeddb';
import { NEVER } from 'rxjs';
import type { Me } from '../../../../../shared/auth/auth-api';
import { AuthStore } from '../../../auth/auth-store';
import { openDeviceDb, type DeviceDb } from '../../device-store/device-db';
import type { FakeSyncServer } from '../../device-store/testing/fake-sync-server';
import type { BrowserStorage, StorageNumbers } from '../browser-storage';
import { BROWSER_STORAGE } from '../browser-storage';
import { DeviceStore } from '../device-store';
import { DEVICE_STORE_BACKEND } from '../device-store-backend';

/** The browser's storage manager as a spec sets it up. */
export class FakeBrowserStorage implements BrowserStorage {
  kept: boolean | null = false;
  /** What the browser answers to persist(). */
  grants: boolean | null = true;
  numbers: StorageNumbers | null = { usage: 12e6, quota: 2e9 };
  room = true;
  persistCalls = 0;

  async persisted(): Promise<boolean | null> {
    return this.kept;
  }
  async persist(): Promise<boolean | null> {
    this.persistCalls++;
    this.kept = this.grants;
    return this.kept;
  }
  async estimate(): Promise<StorageNumbers | null> {
    return this.numbers;
  }
  async hasRoomForWrite(): Promise<boolean> {
    return this.room;
  }
}

let opened = 0;

/**
 * DeviceStore on its own fake IndexedDB, syncing with the in-memory server. Rounds run at start, after
 * writes and when a spec asks; never on a timer or a reconnect event during a spec.
 */
export function provideTestDeviceStore(server: FakeSyncServer, storage: FakeBrowserStorage, patchDb?: (db: DeviceDb) => void): Provider[] {
  return [
    {
      provide: DEVICE_STORE_BACKEND,
      useValue: {
        openDb: async (deviceId: string, onVersionChange: () => void) => {
          // liveQuery stays silent while Dexie knows no global IndexedDB. The specs' bundles may load Dexie
          // before 'fake-indexeddb/auto' has run, so hand it one here.
          Dexie.dependencies.indexedDB ??= new IDBFactory();
          Dexie.dependencies.IDBKeyRange ??= IDBKeyRange;
          opened++;
          const db = await openDeviceDb({ name: `rimelog-spec-${opened}`, deviceId, indexedDB: new IDBFactory(), IDBKeyRange, onVersionChange });
          patchDb?.(db);
          return db;
        },
        transport: server.transport(),
        uploads: server.uploads(),
        now: () => Date.now(),
        engine: { intervalMs: 60 * 60_000, online$: NEVER, lock: <T>(round: () => Promise<T>) => round() },
      },
    },
    { provide: BROWSER_STORAGE, useValue: storage },
  ];
}

/** Waits until `condition` holds, running change detection (and so effects) in between. */
export async function until(condition: () => boolean, what: string, timeoutMs = 5_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (!condition()) {
    if (Date.now() > deadline) throw new Error(`Timed out waiting until ${what}`);
    TestBed.tick();
    await new Promise((resolve) => setTimeout(resolve, 10));
  }
  TestBed.tick();
}

/** Signs `me` in, starts the store and waits until its first round is over. */
export async function startSignedIn(me: Me): Promise<DeviceStore> {
  TestBed.inject(AuthStore).adoptSession(me);
  const store = TestBed.inject(DeviceStore);
  store.start();
  await until(() => store.isRunning() && store.status() !== null && store.status()?.syncing === false && store.status()?.online !== null, 'the first round is over');
  return store;
}
