import type { Routes } from '@angular/router';
import { adminGuard, signedInGuard } from './core/signed-in-guard';

export const routes: Routes = [
  { path: '', pathMatch: 'full', redirectTo: 'projects' },
  { path: 'sign-in', title: 'Sign in · Ergodic', loadComponent: () => import('./auth/sign-in-page') },
  { path: 'sign-up', title: 'Create an account · Ergodic', loadComponent: () => import('./auth/sign-up-page') },
  { path: 'forgot-password', title: 'Forgot password · Ergodic', loadComponent: () => import('./auth/forgot-password-page') },
  { path: 'reset-password', title: 'Choose a new password · Ergodic', loadComponent: () => import('./auth/reset-password-page') },
  // Public on purpose: the page explains the invitation before asking anyone to sign in.
  { path: 'invitations/:token', title: 'Invitation · Ergodic', loadComponent: () => import('./projects/invitation-page') },
  // Public on purpose: an access link is read without signing in; the server checks the token.
  { path: 'links/:token', title: 'Shared with you · Ergodic', loadComponent: () => import('./reports/link-report-page') },
  { path: 'reports/:id', title: 'Report · Ergodic', canActivate: [signedInGuard], loadComponent: () => import('./reports/report-page') },
  { path: 'series/:id', title: 'Series · Ergodic', canActivate: [signedInGuard], loadComponent: () => import('./series/series-page') },
  { path: 'projects', title: 'Projects · Ergodic', canActivate: [signedInGuard], loadComponent: () => import('./projects/projects-page') },
  { path: 'projects/:id', title: 'Project · Ergodic', canActivate: [signedInGuard], loadComponent: () => import('./projects/project-page') },
  {
    path: 'projects/:id/settings', title: 'Project settings · Ergodic', canActivate: [signedInGuard],
    loadComponent: () => import('./projects/project-settings-page'),
  },
  {
    path: 'trajectories/:id/view', title: 'Frame viewer · Ergodic', canActivate: [signedInGuard],
    loadComponent: () => import('./viewer/viewer-page'),
  },
  { path: 'account/tokens', title: 'API tokens · Ergodic', canActivate: [signedInGuard], loadComponent: () => import('./auth/tokens-page') },
  { path: 'admin/users', title: 'Users · Ergodic', canActivate: [adminGuard], loadComponent: () => import('./admin/users-page') },
  { path: 'admin/mail', title: 'Sent mail · Ergodic', canActivate: [adminGuard], loadComponent: () => import('./admin/dev-mail-page') },
  { path: '**', title: 'Not found · Ergodic', loadComponent: () => import('./shell/not-found-page') },
];
