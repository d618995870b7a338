// First: Dexie reads the global indexedDB once when it loads (each store still gets its own factory).
import 'fake-indexeddb/auto';
import { HttpTestingController, type TestRequest } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { filter, firstValueFrom, timeout } from 'rxjs';
import type { FieldData } from '../../../../shared/competition/field-data';
import { apiError, meFor, organiser, otherRaceId, raceId, startOfficial } from '../../auth/testing/auth-fixtures';
import { appTestProviders, blankRoutes } from '../../testing/app-test-providers';
import { FakeSyncServer } from '../device-store/testing/fake-sync-server';
import type { DeviceStore } from '../sync/device-store';
import { FakeBrowserStorage, provideTestDeviceStore, startSignedIn, until } from '../sync/testing/test-device-store';
import { FieldDataStore, fieldDataUrl } from './field-data-store';
import { fieldDataFor } from './testing/field-data-fixture';

const official = meFor('official-one', 'First Official', [startOfficial]);
const officialOfTwoRaces = meFor('official-one', 'First Official', [startOfficial, { role: 'official', competitionId: otherRaceId, area: 'finish' }]);

function setUp() {
  TestBed.configureTestingModule({
    providers: [...appTestProviders(blankRoutes('', 'sign-in')), ...provideTestDeviceStore(new FakeSyncServer(), new FakeBrowserStorage())],
  });
  return TestBed.inject(HttpTestingController);
}

/** Waits until `count` requests to the competition's field data have gone out, and hands them over. */
async function requestsFor(http: HttpTestingController, competitionId: string, count = 1): Promise<TestRequest[]> {
  const found: TestRequest[] = [];
  await until(() => {
    found.push(...http.match(fieldDataUrl(competitionId)));
    return found.length >= count;
  }, `${count} field data request(s) for ${competitionId}`);
  return found;
}

/** The stored copy once `ready` holds for it. */
function keptCopy(store: FieldDataStore, competitionId: string, ready: (data: FieldData | null) => boolean): Promise<FieldData | null> {
  return firstValueFrom(store.watch(competitionId).pipe(filter(ready), timeout(5_000)));
}

/** Keeps a first good copy through a refresh, as a screen would. */
async function keepFirstCopy(http: HttpTestingController, store: FieldDataStore): Promise<void> {
  const refreshing = store.refresh(raceId);
  (await requestsFor(http, raceId))[0]!.flush(fieldDataFor(raceId));
  expect(await refreshing).toEqual({ ok: true });
}

const offline = (request: TestRequest) => request.error(new ProgressEvent('error'), { status: 0, statusText: 'Unknown Error' });
const pause = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

describe('FieldDataStore', () => {
  beforeEach(() => localStorage.clear());

  it('when a screen asks, then the field data is fetched past the service worker, kept on the device and shown', async () => {
    const http = setUp();
    await startSignedIn(official);
    const store = TestBed.inject(FieldDataStore);

    const refreshing = store.refresh(raceId);
    const [request] = await requestsFor(http, raceId);
    expect(request!.request.method).toBe('GET');
    expect(request!.request.headers.get('ngsw-bypass')).toBe('true');
    request!.flush(fieldDataFor(raceId));

    expect(await refreshing).toEqual({ ok: true });
    const kept = await keptCopy(store, raceId, (data) => data !== null);
    expect(kept?.startList.map((e) => e.bib)).toEqual([1, 2, 3]);
    expect(kept?.instruments.map((i) => i.label)).toEqual(['PYR-01', 'PYR-02']);
    expect(store.failureFor(raceId)()).toBeNull();
  });

  it('when the device has no copy yet, then watching shows null rather than waiting or failing', async () => {
    setUp();
    await startSignedIn(official);
    expect(await keptCopy(TestBed.inject(FieldDataStore), otherRaceId, () => true)).toBeNull();
  });

  it('when the server cannot be reached, then the refresh does not throw, says so in words, and the kept copy stays', async () => {
    const http = setUp();
    await startSignedIn(official);
    const store = TestBed.inject(FieldDataStore);
    await keepFirstCopy(http, store);

    const refreshing = store.refresh(raceId);
    offline((await requestsFor(http, raceId))[0]!);
    const result = await refreshing;

    expect(result.ok).toBe(false);
    const failure = store.failureFor(raceId)();
    expect(failure?.message).toBe(
      'The server cannot be reached from this device right now. Try again when there is a signal. The start list and instruments already on this device stay in use.',
    );
    expect(store.lastFailure()).toEqual(failure);
    expect((await keptCopy(store, raceId, (data) => data !== null))?.fetchedAt).toBe(fieldDataFor(raceId).fetchedAt);
  });

  it('when the server refuses, then its own words are reported', async () => {
    const http = setUp();
    await startSignedIn(official);
    const store = TestBed.inject(FieldDataStore);

    const refreshing = store.refresh(raceId);
    const words = 'Your role in this competition does not allow this. Ask the area leader or the organiser.';
    (await requestsFor(http, raceId))[0]!.flush(apiError('forbidden', words), { status: 403, statusText: 'Forbidden' });

    expect((await refreshing).ok).toBe(false);
    expect(store.failureFor(raceId)()?.message).toBe(`${words} The start list and instruments already on this device stay in use.`);
  });

  it('when the answer is not field data this app can read, then the old copy stays and the failure says to update the app', async () => {
    const http = setUp();
    await startSignedIn(official);
    const store = TestBed.inject(FieldDataStore);
    await keepFirstCopy(http, store);

    const refreshing = store.refresh(raceId);
    const changed = { ...fieldDataFor(raceId, '2027-01-09T08:00:00.000Z'), instruments: [{ label: 'PYR-09', purpose: 'thermometer' }] };
    (await requestsFor(http, raceId))[0]!.flush(changed);

    expect((await refreshing).ok).toBe(false);
    expect(store.failureFor(raceId)()?.message).toContain('could not be read by this version of the app');
    expect(store.failureFor(raceId)()?.message).toContain('Update the app at the hut.');
    expect((await keptCopy(store, raceId, (data) => data !== null))?.fetchedAt).toBe(fieldDataFor(raceId).fetchedAt);
  });

  it('when a later refresh goes well, then the failure is cleared', async () => {
    const http = setUp();
    await startSignedIn(official);
    const store = TestBed.inject(FieldDataStore);
    const failing = store.refresh(raceId);
    offline((await requestsFor(http, raceId))[0]!);
    await failing;
    expect(store.failureFor(raceId)()).not.toBeNull();

    await keepFirstCopy(http, store);
    expect(store.failureFor(raceId)()).toBeNull();
    expect(store.lastFailure()).toBeNull();
  });

  it('when the same competition is refreshed twice at once, then one request goes out and both calls get its outcome', async () => {
    const http = setUp();
    await startSignedIn(official);
    const store = TestBed.inject(FieldDataStore);

    const first = store.refresh(raceId);
    const second = store.refresh(raceId);
    const requests = await requestsFor(http, raceId);
    await pause(30);
    requests.push(...http.match(fieldDataUrl(raceId)));
    expect(requests).toHaveLength(1);
    requests[0]!.flush(fieldDataFor(raceId));
    expect(await Promise.all([first, second])).toEqual([{ ok: true }, { ok: true }]);
  });

  it('when a sync round succeeds, then every competition the official has a role in is refreshed by itself', async () => {
    const http = setUp();
    const device: DeviceStore = await startSignedIn(officialOfTwoRaces);
    const store = TestBed.inject(FieldDataStore);
    store.start();

    // The device already knows a sync time, so both competitions are fetched at once.
    (await requestsFor(http, raceId))[0]!.flush(fieldDataFor(raceId));
    (await requestsFor(http, otherRaceId))[0]!.flush(fieldDataFor(otherRaceId));
    await until(() => store.competitionIds().length === 2, 'both competitions are known');

    await pause(5); // a new round gets a new sync time, even on a fast machine
    const round = await device.syncNow();
    expect(round.ok).toBe(true);
    (await requestsFor(http, raceId))[0]!.flush(fieldDataFor(raceId, '2027-01-09T07:00:00.000Z'));
    (await requestsFor(http, otherRaceId))[0]!.flush(fieldDataFor(otherRaceId, '2027-01-09T07:00:00.000Z'));

    expect((await keptCopy(store, raceId, (data) => data?.fetchedAt === '2027-01-09T07:00:00.000Z'))?.competitionId).toBe(raceId);
    expect((await keptCopy(store, otherRaceId, (data) => data?.fetchedAt === '2027-01-09T07:00:00.000Z'))?.competitionId).toBe(otherRaceId);
  });

  it('when the organiser of every competition is signed in, then nothing is fetched by itself: their screens ask', async () => {
    const http = setUp();
    const device = await startSignedIn(organiser);
    const store = TestBed.inject(FieldDataStore);
    store.start();
    await pause(5);
    await device.syncNow();
    await until(() => device.status()?.syncing === false, 'the round is over');
    await pause(30);
    TestBed.tick();

    expect(store.competitionIds()).toEqual([]);
    http.verify();
  });
});
