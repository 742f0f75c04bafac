import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { map, type Observable } from 'rxjs';
import { newApiTokenSchema, type ApiToken, type NewApiToken } from '../../../shared/accounts';
import { unwrap } from '../core/api-envelope';

@Injectable({ providedIn: 'root' })
export class TokensApi {
  private readonly http = inject(HttpClient);

  create(name: string, expiresInDays: number | null): Observable<NewApiToken> {
    const body = expiresInDays ? { name, expiresInDays } : { name };
    return this.http.post('/api/tokens', body).pipe(map(unwrap('token', newApiTokenSchema)));
  }

  revoke(id: number): Observable<void> {
    return this.http.delete<void>(`/api/tokens/${id}`);
  }
}

/** Plain words for a token's state, as the tokens page shows it. */
export function tokenState(token: ApiToken, now = Date.now()): { active: boolean; label: string } {
  if (token.revokedAt) {
    const why = { owner: 'Revoked', password_reset: 'Revoked by a password reset', account_disabled: 'Revoked when the account was disabled' };
    return { active: false, label: why[token.revokedReason ?? 'owner'] };
  }
  if (token.expiresAt && new Date(token.expiresAt).getTime() <= now) return { active: false, label: 'Expired' };
  return { active: true, label: 'Active' };
}
