import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { map, type Observable } from 'rxjs';
import { newApiTokenSchema, type NewApiToken } from '../../../shared/accounts';
import { unwrap } from '../core/api-envelope';

@Injectable({ providedIn: 'root' })
export class TokensApi {
  private readonly http = inject(HttpClient);

  create(name: string): Observable<NewApiToken> {
    return this.http.post('/api/tokens', { name }).pipe(map(unwrap('token', newApiTokenSchema)));
  }

  revoke(id: number): Observable<void> {
    return this.http.delete<void>(`/api/tokens/${id}`);
  }
}
