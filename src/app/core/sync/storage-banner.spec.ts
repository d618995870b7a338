// First: Dexie reads the global indexedDB once when it loads (each store still gets its own factory).
import 'fake-indexeddb/auto';
import { TestBed } from '@angular/core/testing';
import { firstOfficial } from '../../auth/testing/auth-fixtures';
import type { DeviceDb } from '../device-store/device-db';
import { StorageFullError } from '../device-store/store-errors';
import { FakeSyncServer } from '../device-store/testing/fake-sync-server';
import { competitionId, startCheck } from '../device-store/testing/test-device';
import { appTestProviders, blankRoutes } from '../../testing/app-test-providers';
import { StorageBanner } from './storage-banner';
import { FakeBrowserStorage, provideTestDeviceStore, startSignedIn, until } from './testing/test-device-store';

/** The browser refuses new outbox rows as a full disk does: Dexie reports a QuotaExceededError. */
function diskFullFor(db: DeviceDb, isFull: () => boolean): void {
  const add = db.outbox.add.bind(db.outbox);
  db.outbox.add = ((...args: Parameters<typeof add>) =>
    isFull() ? Promise.reject(new DOMException('The quota has been exceeded.', 'QuotaExceededError')) : add(...args)) as typeof add;
}

async function setUp(storage = new FakeBrowserStorage()) {
  localStorage.clear();
  let full = false;
  TestBed.configureTestingModule({
    providers: [
      ...appTestProviders(blankRoutes('', 'sync')),
      ...provideTestDeviceStore(new FakeSyncServer(), storage, (db) => diskFullFor(db, () => full)),
    ],
  });
  const store = await startSignedIn(firstOfficial);
  const fixture = TestBed.createComponent(StorageBanner);
  const element = fixture.nativeElement as HTMLElement;
  const alert = () => {
    fixture.detectChanges();
    return element.querySelector('[role="alert"]');
  };
  return { store, storage, element, fixture, alert, setDiskFull: (value: boolean) => (full = value) };
}

describe('StorageBanner', () => {
  it('when a write is refused for lack of space, then it is not silent: the write fails and a banner shows the way out until there is room', async () => {
    const { store, storage, alert, setDiskFull } = await setUp();
    expect(alert()).toBeNull();
    setDiskFull(true);
    storage.room = false;

    await expect(store.createRecord('start-check', competitionId, 'start', startCheck(12))).rejects.toBeInstanceOf(StorageFullError);

    await until(() => alert() !== null, 'the banner shows');
    expect(alert()?.textContent).toContain('Storage full: the last record was NOT saved.');
    const labels = [...alert()!.querySelectorAll('button')].map((b) => b.textContent?.trim());
    expect(labels).toEqual(['Sync now', 'Export backup']);

    // A sync alone does not free the disk: the banner stays.
    await store.syncNow();
    expect(alert()).not.toBeNull();

    // The browser takes a write again: the banner goes at the next look.
    setDiskFull(false);
    storage.room = true;
    await store.syncNow();
    await until(() => alert() === null, 'the banner goes');
  });

  it('when storage is 85 % used, then a warning says so in numbers and points to the sync screen', async () => {
    const storage = new FakeBrowserStorage();
    storage.numbers = { usage: 850e6, quota: 1e9 };
    const { element, fixture } = await setUp(storage);

    await until(() => {
      fixture.detectChanges();
      return element.querySelector('[role="status"]') !== null;
    }, 'the warning shows');
    expect(element.textContent).toContain('Storage 85 % used.');
    expect(element.querySelector('a')?.getAttribute('href')).toBe('/sync');
  });
});
