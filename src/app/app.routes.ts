import type { Routes } from '@angular/router';

export const routes: Routes = [
  {
    path: '',
    title: 'Competitions · Rimelog',
    loadComponent: () => import('./competitions/competitions-page').then((m) => m.CompetitionsPage),
  },
  { path: '**', redirectTo: '' },
];
