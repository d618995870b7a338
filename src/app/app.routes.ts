import type { Routes } from '@angular/router';

export const routes: Routes = [
  {
    path: '',
    title: 'Competitions · Rimelog',
    loadComponent: () => import('./competitions/competitions-page').then((m) => m.CompetitionsPage),
  },
  {
    path: 'competitions/:id/rules',
    title: 'Rules in force · Rimelog',
    loadComponent: () => import('./rules/rules-page').then((m) => m.RulesPage),
  },
  { path: '**', redirectTo: '' },
];
