import { inject } from '@angular/core';
import { Router, type CanActivateFn, type UrlTree } from '@angular/router';
import { AuthStore } from './auth-store';

// Guards read the cached official, so they decide at once and the same way with no network. The
// server checks every request again; these only keep officials out of screens that would refuse them.

function signInFirst(returnUrl: string): UrlTree {
  return inject(Router).createUrlTree(['/sign-in'], { queryParams: { returnUrl } });
}

function notAllowed(): UrlTree {
  return inject(Router).createUrlTree(['/not-allowed']);
}

/** Anyone signed in on this device (or who took it over by PIN). */
export const signedInGuard: CanActivateFn = (_route, state) => inject(AuthStore).isSignedIn() || signInFirst(state.url);

/** Organisers only (of any competition, or of all). */
export const organiserGuard: CanActivateFn = (_route, state) => {
  const auth = inject(AuthStore);
  if (!auth.isSignedIn()) return signInFirst(state.url);
  return auth.can('organiser') || notAllowed();
};

/** Anyone with a role in the competition named by the route's `:id`. */
export const competitionRoleGuard: CanActivateFn = (route, state) => {
  const auth = inject(AuthStore);
  if (!auth.isSignedIn()) return signInFirst(state.url);
  const competitionId = route.paramMap.get('id');
  return (competitionId !== null && auth.hasAnyRoleIn(competitionId)) || notAllowed();
};
