import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { map, type Observable } from 'rxjs';
import type { SignedInUser } from './user';

/** One method per /api/auth endpoint. */
@Injectable({ providedIn: 'root' })
export class AuthApi {
  private readonly http = inject(HttpClient);

  me(): Observable<SignedInUser> {
    return this.http.get<{ user: SignedInUser }>('/api/auth/me').pipe(map((r) => r.user));
  }

  signIn(email: string, password: string): Observable<SignedInUser> {
    return this.http.post<{ user: SignedInUser }>('/api/auth/login', { email, password }).pipe(map((r) => r.user));
  }

  signUp(email: string, password: string, displayName: string): Observable<SignedInUser> {
    return this.http.post<{ user: SignedInUser }>('/api/auth/register', { email, password, displayName }).pipe(map((r) => r.user));
  }

  signOut(): Observable<void> {
    return this.http.post<void>('/api/auth/logout', {});
  }

  requestPasswordReset(email: string): Observable<{ message: string }> {
    return this.http.post<{ message: string }>('/api/auth/password-reset', { email });
  }

  confirmPasswordReset(token: string, password: string): Observable<SignedInUser> {
    return this.http.post<{ user: SignedInUser }>('/api/auth/password-reset/confirm', { token, password }).pipe(map((r) => r.user));
  }
}
