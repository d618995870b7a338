// First: Dexie reads the global indexedDB once when it loads (each store still gets its own factory).
import 'fake-indexeddb/auto';
import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { AuthStore } from '../../auth/auth-store';
import { firstOfficial, secondOfficial } from '../../auth/testing/auth-fixtures';
import { RecordRefusedError } from '../device-store/store-errors';
import { FakeSyncServer } from '../device-store/testing/fake-sync-server';
import { competitionId, startCheck } from '../device-store/testing/test-device';
import { appTestProviders, blankRoutes } from '../../testing/app-test-providers';
import { DeviceStore } from './device-store';
import { StorageGuard } from './storage-guard';
import { FakeBrowserStorage, provideTestDeviceStore, startSignedIn, until } from './testing/test-device-store';

function setUp(server = new FakeSyncServer(), storage = new FakeBrowserStorage()) {
  TestBed.configureTestingModule({
    providers: [...appTestProviders(blankRoutes('', 'sign-in')), ...provideTestDeviceStore(server, storage)],
  });
  return { server, storage };
}

describe('DeviceStore', () => {
  beforeEach(() => localStorage.clear());

  it('when an official records, then the record reaches the server by itself, carrying their id and this device id', async () => {
    const { server } = setUp();
    const store = await startSignedIn(firstOfficial);

    await store.createRecord('start-check', competitionId, 'start', startCheck(21));

    // No "Sync now": the write itself wakes the sync loop.
    await until(() => server.received.length === 1, 'the op arrives');
    expect(server.received[0]).toMatchObject({ userId: 'official-one', deviceId: store.deviceId, seq: 1 });
  });

  it('when a second official takes over by PIN with no signal, then their records carry their own id', async () => {
    const { server } = setUp();
    const store = await startSignedIn(firstOfficial);
    TestBed.inject(AuthStore).useLocally(secondOfficial, '2468');

    await store.createRecord('start-check', competitionId, 'start', startCheck(22));

    await until(() => server.received.length === 1, 'the op arrives');
    expect(server.received[0]?.userId).toBe('official-two');
  });

  it('when the official signs out of this device, then the sync loop stops and nothing can be recorded without a name', async () => {
    const { server } = setUp();
    const store = await startSignedIn(firstOfficial);
    const auth = TestBed.inject(AuthStore);

    const signingOut = auth.signOut();
    TestBed.inject(HttpTestingController).expectOne('/api/auth/sign-out').flush(null, { status: 204, statusText: 'No Content' });
    await signingOut;

    await until(() => !store.isRunning(), 'the loop stops');
    await expect(store.createRecord('start-check', competitionId, 'start', startCheck(23))).rejects.toBeInstanceOf(RecordRefusedError);
    const calls = server.calls.length;
    await new Promise((resolve) => setTimeout(resolve, 50));
    expect(server.calls.length).toBe(calls);
  });

  it('when the device database is first used, then the browser is asked to keep it once; a later start only asks whether it does', async () => {
    const { storage } = setUp();
    storage.grants = false;
    await startSignedIn(firstOfficial);
    expect(storage.persistCalls).toBe(1);

    TestBed.resetTestingModule();
    TestBed.configureTestingModule({
      providers: [...appTestProviders(blankRoutes('', 'sign-in')), ...provideTestDeviceStore(new FakeSyncServer(), storage)],
    });
    TestBed.inject(AuthStore).adoptSession(firstOfficial);
    const store = TestBed.inject(DeviceStore);
    store.start();
    await until(() => store.isRunning() && TestBed.inject(StorageGuard).persistence() === 'may-clear', 'the second start has looked');
    expect(storage.persistCalls).toBe(1);
  });

  it('when a certificate is attached to a record, then it is kept with its photo record and uploaded after that record', async () => {
    const { server } = setUp();
    const store = await startSignedIn(firstOfficial);
    const { record } = await store.createRecord('start-check', competitionId, 'start', startCheck(24));
    const pdf = new Blob([new TextEncoder().encode('%PDF-1.7 calibration')], { type: 'application/pdf' });

    const { record: photo } = await store.attachPhoto(record.id, pdf, 'certificate', 'pyrometer calibration');

    expect(photo.fields).toMatchObject({ of: record.id, purpose: 'certificate', mediaType: 'application/pdf', width: null, caption: 'pyrometer calibration' });
    await until(() => server.files.has(photo.fields['sha256'] as string), 'the file is uploaded');
    expect(server.records.has(photo.id)).toBe(true);
    expect(server.calls.lastIndexOf('push')).toBeLessThan(server.calls.indexOf('put-file'));
    expect(await store.photoUrl(photo.fields['sha256'] as string, 'application/pdf')).toMatch(/^blob:/);
  });

  it('when a file is not a picture this device can open, then nothing is saved and the official is told why', async () => {
    setUp();
    const store = await startSignedIn(firstOfficial);
    const { record } = await store.createRecord('start-check', competitionId, 'start', startCheck(25));
    await expect(store.attachPhoto(record.id, new Blob(['not a picture'], { type: 'image/jpeg' }), 'evidence')).rejects.toThrow(/not a photo this device can open/);
  });
});
