import type { Routes } from '@angular/router';

export const routes: Routes = [
  { path: '', pathMatch: 'full', redirectTo: 'projects' },
  { path: 'sign-in', title: 'Sign in · Ergodic', loadComponent: () => import('./auth/sign-in-page') },
  { path: 'projects', title: 'Projects · Ergodic', loadComponent: () => import('./projects/projects-page') },
  { path: '**', title: 'Not found · Ergodic', loadComponent: () => import('./shell/not-found-page') },
];
