// First: Dexie reads the global indexedDB once when it loads (each store still gets its own factory).
import 'fake-indexeddb/auto';
import { TestBed } from '@angular/core/testing';
import { firstOfficial } from '../../auth/testing/auth-fixtures';
import { createRecordWriter } from '../device-store/record-writer';
import { createSyncEngine } from '../device-store/sync-engine';
import { FakeSyncServer } from '../device-store/testing/fake-sync-server';
import { competitionId, openTestDevice, otherOfficial, startCheck } from '../device-store/testing/test-device';
import { appTestProviders, blankRoutes } from '../../testing/app-test-providers';
import { SyncStatusStrip } from './sync-status-strip';
import { FakeBrowserStorage, provideTestDeviceStore, startSignedIn, until } from './testing/test-device-store';

async function setUp(server = new FakeSyncServer()) {
  localStorage.clear();
  TestBed.configureTestingModule({
    providers: [...appTestProviders(blankRoutes('', 'sync')), ...provideTestDeviceStore(server, new FakeBrowserStorage())],
  });
  const store = await startSignedIn(firstOfficial);
  const fixture = TestBed.createComponent(SyncStatusStrip);
  const element = fixture.nativeElement as HTMLElement;
  const text = () => {
    fixture.detectChanges();
    return element.textContent?.replace(/\s+/g, ' ').trim() ?? '';
  };
  const item = (key: string) => {
    fixture.detectChanges();
    return element.querySelector<HTMLElement>(`[data-item="${key}"]`);
  };
  return { server, store, fixture, element, text, item };
}

describe('SyncStatusStrip', () => {
  it('when the server cannot be reached and two records were saved, then it says offline and "2 records only on this device"', async () => {
    const server = new FakeSyncServer();
    server.outage = 'unreachable';
    const { store, text, item } = await setUp(server);
    await store.createRecord('start-check', competitionId, 'start', startCheck(1));
    await store.createRecord('start-check', competitionId, 'start', startCheck(2));

    await until(() => text().includes('2 records only on this device'), 'two records wait');
    expect(text()).toContain('Offline: server not reachable');
    expect(text()).toContain('Not synced yet');
    // Offline is boxed and marked, not only coloured.
    expect(item('online')?.classList).toContain('attention');
    expect(item('online')?.textContent).toContain('✕');
  });

  it('when a round succeeded, then it says online, nothing waiting and synced just now, and it opens the sync screen', async () => {
    const { store, element, text } = await setUp();
    await store.createRecord('start-check', competitionId, 'start', startCheck(3));
    await store.syncNow();

    await until(() => text().includes('Nothing waiting to send') && text().includes('Synced just now'), 'the round is over');
    expect(text()).toContain('Online');
    expect(element.querySelector('a')?.getAttribute('href')).toBe('/sync');
  });

  it('when another device changed the same field first, then it says "1 conflict waiting"', async () => {
    const server = new FakeSyncServer();
    const { store, text } = await setUp(server);
    const otherDb = await openTestDevice();
    const otherEngine = createSyncEngine({ db: otherDb, transport: server.transport(), lock: (round) => round() });
    const other = createRecordWriter({ db: otherDb });
    const { record } = await other.createRecord('start-check', competitionId, 'start', startCheck(8), otherOfficial);
    await otherEngine.syncNow();
    await store.syncNow();

    await other.updateRecord(record.id, { note: 'runner cracked' }, otherOfficial);
    await otherEngine.syncNow();
    await store.updateRecord(record.id, { note: 'runner fine' });
    await store.syncNow();

    await until(() => text().includes('1 conflict waiting'), 'the conflict came down');
    otherDb.close();
  });

  it('when the device clock is 5 minutes behind the server, then it warns with the minutes', async () => {
    const server = new FakeSyncServer();
    server.serverTime = () => Date.now() + 5 * 60_000;
    const { text, item } = await setUp(server);

    await until(() => text().includes('Device clock 5 min behind: set the time'), 'the clock warning shows');
    expect(item('clock')?.classList).toContain('attention');
  });

  it('when nobody is signed in, then there is no strip', async () => {
    localStorage.clear();
    TestBed.configureTestingModule({
      providers: [...appTestProviders(blankRoutes('', 'sync')), ...provideTestDeviceStore(new FakeSyncServer(), new FakeBrowserStorage())],
    });
    const fixture = TestBed.createComponent(SyncStatusStrip);
    await fixture.whenStable();
    expect((fixture.nativeElement as HTMLElement).querySelector('a')).toBeNull();
  });
});
