import { TestBed } from '@angular/core/testing';
import { Router } from '@angular/router';
import { appTestProviders, blankRoutes, BlankPage } from '../testing/app-test-providers';
import { competitionRoleGuard, organiserGuard, signedInGuard } from './auth-guards';
import { AuthStore } from './auth-store';
import { firstOfficial, organiser, otherRaceId, raceId } from './testing/auth-fixtures';

function setUp() {
  localStorage.clear();
  TestBed.configureTestingModule({
    providers: appTestProviders(
      blankRoutes(
        '',
        'sign-in',
        'not-allowed',
        { path: 'switch-official', component: BlankPage, canActivate: [signedInGuard] },
        { path: 'mailbox', component: BlankPage, canActivate: [organiserGuard] },
        { path: 'competitions/:id/rules', component: BlankPage, canActivate: [competitionRoleGuard] },
      ),
    ),
  });
  const router = TestBed.inject(Router);
  const visit = async (url: string) => {
    await router.navigateByUrl(url);
    return router.url;
  };
  return { store: TestBed.inject(AuthStore), visit };
}

describe('route guards', () => {
  it('when nobody is signed in, then a signed-in page sends them to sign in and remembers where they were going', async () => {
    const { visit } = setUp();
    expect(await visit('/switch-official')).toBe('/sign-in?returnUrl=%2Fswitch-official');
    expect(await visit(`/competitions/${raceId}/rules`)).toBe(`/sign-in?returnUrl=%2Fcompetitions%2F${raceId}%2Frules`);
    expect(await visit('/mailbox')).toBe('/sign-in?returnUrl=%2Fmailbox');
  });

  it('when an official is signed in, then their pages open, and the mailbox is not for them', async () => {
    const { store, visit } = setUp();
    store.adoptSession(firstOfficial);
    expect(await visit('/switch-official')).toBe('/switch-official');
    expect(await visit('/mailbox')).toBe('/not-allowed');
  });

  it('when the official has no role in a competition, then its rules do not open', async () => {
    const { store, visit } = setUp();
    store.adoptSession(firstOfficial);
    expect(await visit(`/competitions/${raceId}/rules`)).toBe(`/competitions/${raceId}/rules`);
    expect(await visit(`/competitions/${otherRaceId}/rules`)).toBe('/not-allowed');
  });

  it('when an organiser of all competitions is signed in, then the mailbox and every rules page open', async () => {
    const { store, visit } = setUp();
    store.adoptSession(organiser);
    expect(await visit('/mailbox')).toBe('/mailbox');
    expect(await visit(`/competitions/${otherRaceId}/rules`)).toBe(`/competitions/${otherRaceId}/rules`);
  });
});
