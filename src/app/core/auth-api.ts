import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { map, type Observable } from 'rxjs';
import { noticeSchema, signedInUserSchema, type SignedInUser } from '../../../shared/accounts';
import { unwrap } from './api-envelope';

const readUser = unwrap('user', signedInUserSchema);
const readSession = unwrap('user', signedInUserSchema.nullable());

/** One method per /api/auth endpoint. */
@Injectable({ providedIn: 'root' })
export class AuthApi {
  private readonly http = inject(HttpClient);

  /** Who the session belongs to, or null: answers 200 either way, so a signed-out start logs no failed request. */
  session(): Observable<SignedInUser | null> {
    return this.http.get('/api/auth/session').pipe(map(readSession));
  }

  signIn(email: string, password: string): Observable<SignedInUser> {
    return this.http.post('/api/auth/login', { email, password }).pipe(map(readUser));
  }

  signUp(email: string, password: string, displayName: string): Observable<SignedInUser> {
    return this.http.post('/api/auth/register', { email, password, displayName }).pipe(map(readUser));
  }

  signOut(): Observable<void> {
    return this.http.post<void>('/api/auth/logout', {});
  }

  requestPasswordReset(email: string): Observable<string> {
    return this.http.post('/api/auth/password-reset', { email }).pipe(map(unwrap('message', noticeSchema)));
  }

  confirmPasswordReset(token: string, password: string): Observable<SignedInUser> {
    return this.http.post('/api/auth/password-reset/confirm', { token, password }).pipe(map(readUser));
  }
}
