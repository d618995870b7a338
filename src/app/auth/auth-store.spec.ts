import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { Router } from '@angular/router';
import { appTestProviders, blankRoutes } from '../testing/app-test-providers';
import { AuthStore } from './auth-store';
import { ServerReachability } from './server-reachability';
import { apiError, firstOfficial, meFor, organiser, otherRaceId, raceId, secondOfficial, startOfficial } from './testing/auth-fixtures';

/** A fresh start of the app: new services over whatever this device's storage holds. */
function startApp() {
  TestBed.resetTestingModule();
  TestBed.configureTestingModule({
    providers: appTestProviders(blankRoutes('', 'sign-in')),
  });
  return {
    store: TestBed.inject(AuthStore),
    http: TestBed.inject(HttpTestingController),
    router: TestBed.inject(Router),
    reachability: TestBed.inject(ServerReachability),
  };
}

async function answerMe(http: HttpTestingController, answer: (request: ReturnType<HttpTestingController['expectOne']>) => void) {
  answer(await vi.waitFor(() => http.expectOne('/api/auth/me')));
}

describe('AuthStore', () => {
  beforeEach(() => localStorage.clear());
  afterEach(() => TestBed.inject(HttpTestingController).verify());

  it('when an official signed in earlier and the server cannot be reached, then the app restarts as them', async () => {
    startApp().store.adoptSession(firstOfficial);

    const { store, http, reachability } = startApp();
    expect(store.user()?.displayName).toBe('First Official');
    const refreshed = store.refresh();
    await answerMe(http, (request) => request.error(new ProgressEvent('error'), { status: 0 }));
    await refreshed;

    expect(store.isSignedIn()).toBe(true);
    expect(store.activeUserId()).toBe('official-one');
    expect(reachability.isOffline()).toBe(true);
  });

  it('when the server fails with 500, then the cached official stays signed in', async () => {
    startApp().store.adoptSession(firstOfficial);
    const { store, http } = startApp();
    const refreshed = store.refresh();
    await answerMe(http, (request) => request.flush(apiError('internal', 'Something broke.'), { status: 500, statusText: 'Error' }));
    await refreshed;
    expect(store.user()?.displayName).toBe('First Official');
  });

  it('when the server answers 401, then the cache is cleared and the official is sent to sign in', async () => {
    startApp().store.adoptSession(firstOfficial);
    const { store, http, router } = startApp();
    await router.navigateByUrl('/');
    const refreshed = store.refresh();
    await answerMe(http, (request) =>
      request.flush(apiError('unauthenticated', 'You are not signed in.'), { status: 401, statusText: 'Unauthorized' }),
    );
    await refreshed;

    expect(store.isSignedIn()).toBe(false);
    expect(store.sessionHasEnded()).toBe(true);
    await vi.waitFor(() => expect(router.url).toBe('/sign-in?returnUrl=%2F'));
    expect(startApp().store.isSignedIn()).toBe(false);
  });

  it('when nobody was signed in and the server answers 401, then nothing moves', async () => {
    const { store, http, router } = startApp();
    await router.navigateByUrl('/');
    const refreshed = store.refresh();
    await answerMe(http, (request) => request.flush(apiError('unauthenticated', 'Not signed in.'), { status: 401, statusText: 'Unauthorized' }));
    await refreshed;
    expect(store.sessionHasEnded()).toBe(false);
    expect(router.url).toBe('/');
  });

  it('when the server describes the official afresh, then new roles replace the cached ones and are kept', async () => {
    startApp().store.adoptSession(firstOfficial);
    const { store, http } = startApp();
    expect(store.can('area-leader', raceId)).toBe(false);
    const promoted = meFor('official-one', 'First Official', [{ role: 'area-leader', competitionId: raceId, area: 'start' }]);
    const refreshed = store.refresh();
    await answerMe(http, (request) => request.flush(promoted));
    await refreshed;

    expect(store.can('area-leader', raceId)).toBe(true);
    expect(startApp().store.can('area-leader', raceId)).toBe(true);
  });

  it('when asked about roles, then competition roles count only there and global organisers everywhere', () => {
    const { store } = startApp();
    store.adoptSession(firstOfficial);
    expect(store.can('official', raceId)).toBe(true);
    expect(store.can('official', otherRaceId)).toBe(false);
    expect(store.can('official')).toBe(true);
    expect(store.can('organiser')).toBe(false);
    expect(store.hasAnyRoleIn(otherRaceId)).toBe(false);

    store.adoptSession(organiser);
    expect(store.can('organiser', otherRaceId)).toBe(true);
    expect(store.hasAnyRoleIn(raceId)).toBe(true);
    expect(store.can('official', raceId)).toBe(false);
  });

  it('when under two hours of the session remain, then a gentle notice says when it ends', () => {
    const { store } = startApp();
    const soon = new Date(Date.now() + 90 * 60_000).toISOString();
    store.adoptSession(meFor('official-one', 'First Official', [startOfficial], soon));
    expect(store.expiry().kind).toBe('ending-soon');

    store.adoptSession(meFor('official-one', 'First Official', [startOfficial], new Date(Date.now() + 3 * 3600_000).toISOString()));
    expect(store.expiry().kind).toBe('fine');
  });

  it('when signing out with no signal, then the device forgets the official now and tells the server later', async () => {
    const first = startApp();
    first.store.adoptSession(firstOfficial);
    const signedOut = first.store.signOut();
    first.http.expectOne('/api/auth/sign-out').error(new ProgressEvent('error'), { status: 0 });
    await signedOut;
    expect(first.store.isSignedIn()).toBe(false);

    const { store, http } = startApp();
    expect(store.isSignedIn()).toBe(false);
    const refreshed = store.refresh();
    const owed = await vi.waitFor(() => http.expectOne('/api/auth/sign-out'));
    expect(owed.request.method).toBe('POST');
    owed.flush(null, { status: 204, statusText: 'No Content' });
    await answerMe(http, (request) => request.flush(apiError('unauthenticated', 'Not signed in.'), { status: 401, statusText: 'Unauthorized' }));
    await refreshed;
    expect(store.isSignedIn()).toBe(false);
  });

  it('when an official took over offline and the server is reachable again, then its session follows them', async () => {
    const { store, http } = startApp();
    store.adoptSession(firstOfficial);
    store.useLocally(secondOfficial, '2468');
    expect(store.isHandOverPending()).toBe(true);

    const refreshed = store.refresh();
    await answerMe(http, (request) => request.flush(firstOfficial));
    const handOver = await vi.waitFor(() => http.expectOne('/api/auth/switch'));
    expect(handOver.request.body).toEqual({ userId: 'official-two', pin: '2468' });
    handOver.flush(secondOfficial);
    await refreshed;

    expect(store.isHandOverPending()).toBe(false);
    expect(store.serverUser()?.id).toBe('official-two');
  });

  it('when the app restarts after an offline takeover, then the server answering for the first official does not undo it', async () => {
    const first = startApp();
    first.store.adoptSession(firstOfficial);
    first.store.useLocally(secondOfficial, '2468');

    const { store, http } = startApp();
    const refreshed = store.refresh();
    await answerMe(http, (request) => request.flush(firstOfficial));
    await refreshed;

    expect(store.activeUserId()).toBe('official-two');
    expect(store.isHandOverPending()).toBe(true);
  });
});
