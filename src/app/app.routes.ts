import type { Routes } from '@angular/router';
import { competitionRoleGuard, organiserGuard, signedInGuard } from './auth/auth-guards';

// Every page is loaded lazily, so the first screen stays small.
export const routes: Routes = [
  {
    path: '',
    title: 'Competitions · Rimelog',
    loadComponent: () => import('./competitions/competitions-page').then((m) => m.CompetitionsPage),
  },
  {
    path: 'competitions/:id/rules',
    title: 'Rules in force · Rimelog',
    canActivate: [competitionRoleGuard],
    loadComponent: () => import('./rules/rules-page').then((m) => m.RulesPage),
  },
  {
    path: 'competitions/:id/start/control-steel',
    title: 'Control steel · Rimelog',
    canActivate: [competitionRoleGuard],
    loadComponent: () => import('./start-area/control-steel/control-steel-page').then((m) => m.ControlSteelPage),
  },
  {
    path: 'competitions/:id/start/checks',
    title: 'Start checks · Rimelog',
    canActivate: [competitionRoleGuard],
    loadComponent: () => import('./start-area/checks/start-checks-page').then((m) => m.StartChecksPage),
  },
  {
    path: 'competitions/:id/start/checks/:checkId',
    title: 'Start check · Rimelog',
    canActivate: [competitionRoleGuard],
    loadComponent: () => import('./start-area/checks/start-check-page').then((m) => m.StartCheckPage),
  },
  {
    path: 'competitions/:id/start/courtesy',
    title: 'Courtesy checks · Rimelog',
    canActivate: [competitionRoleGuard],
    loadComponent: () => import('./start-area/courtesy/courtesy-page').then((m) => m.CourtesyPage),
  },
  {
    path: 'sign-in',
    title: 'Sign in · Rimelog',
    loadComponent: () => import('./auth/sign-in-page').then((m) => m.SignInPage),
  },
  {
    path: 'switch-official',
    title: 'Who is using this device · Rimelog',
    canActivate: [signedInGuard],
    loadComponent: () => import('./auth/switch-official-page').then((m) => m.SwitchOfficialPage),
  },
  {
    path: 'set-pin',
    title: 'Set my PIN · Rimelog',
    canActivate: [signedInGuard],
    loadComponent: () => import('./auth/set-pin-page').then((m) => m.SetPinPage),
  },
  {
    path: 'accept-invitation',
    title: 'Accept the invitation · Rimelog',
    loadComponent: () => import('./auth/accept-invitation-page').then((m) => m.AcceptInvitationPage),
  },
  {
    path: 'forgot-password',
    title: 'Forgot your password · Rimelog',
    loadComponent: () => import('./auth/forgot-password-page').then((m) => m.ForgotPasswordPage),
  },
  {
    path: 'reset-password',
    title: 'Choose a new password · Rimelog',
    loadComponent: () => import('./auth/reset-password-page').then((m) => m.ResetPasswordPage),
  },
  {
    path: 'mailbox',
    title: 'Mailbox · Rimelog',
    canActivate: [organiserGuard],
    loadComponent: () => import('./mail/mailbox-page').then((m) => m.MailboxPage),
  },
  {
    path: 'sync',
    title: 'Sync · Rimelog',
    canActivate: [signedInGuard],
    loadComponent: () => import('./sync/sync-page').then((m) => m.SyncPage),
  },
  {
    path: 'not-allowed',
    title: 'Not for your role · Rimelog',
    loadComponent: () => import('./auth/not-allowed-page').then((m) => m.NotAllowedPage),
  },
  { path: '**', redirectTo: '' },
];
