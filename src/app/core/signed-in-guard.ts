import { inject } from '@angular/core';
import { Router, type CanActivateFn } from '@angular/router';
import { AuthState } from './auth-state';

/** Sends visitors to sign-in, remembering where they were going. */
export const signedInGuard: CanActivateFn = (_route, state) => {
  if (inject(AuthState).isSignedIn()) return true;
  return inject(Router).createUrlTree(['/sign-in'], { queryParams: { next: state.url } });
};

/** Admin pages: visitors sign in first; members are sent to their projects. */
export const adminGuard: CanActivateFn = (_route, state) => {
  const auth = inject(AuthState);
  const router = inject(Router);
  if (!auth.isSignedIn()) return router.createUrlTree(['/sign-in'], { queryParams: { next: state.url } });
  return auth.isAdmin() ? true : router.createUrlTree(['/projects']);
};
