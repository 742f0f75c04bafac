import { HttpErrorResponse, type HttpInterceptorFn } from '@angular/common/http';
import { inject } from '@angular/core';
import { Router } from '@angular/router';
import { catchError, throwError } from 'rxjs';
import { AuthState } from './auth-state';

/** Calls whose 401 is an ordinary answer (nobody signed in, wrong password), not a lost session. */
const EXPECTED_401 = ['/api/auth/login'];

/** When the session is gone (signed out elsewhere, account disabled), go to sign-in and come back after. */
export const unauthorizedInterceptor: HttpInterceptorFn = (req, next) => {
  const auth = inject(AuthState);
  const router = inject(Router);
  return next(req).pipe(catchError((err: unknown) => {
    if (err instanceof HttpErrorResponse && err.status === 401 && !EXPECTED_401.some((p) => req.url.startsWith(p))) {
      auth.clear();
      void router.navigate(['/sign-in'], { queryParams: { next: router.url } });
    }
    return throwError(() => err);
  }));
};
