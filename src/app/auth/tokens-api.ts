import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { map, type Observable } from 'rxjs';

export interface ApiToken {
  id: number;
  name: string;
  /** The first characters, to tell tokens apart. */
  prefix: string;
  createdAt: string;
  lastUsedAt: string | null;
}

export interface NewApiToken extends ApiToken {
  /** The secret itself: returned once, at creation. */
  token: string;
}

@Injectable({ providedIn: 'root' })
export class TokensApi {
  private readonly http = inject(HttpClient);

  create(name: string): Observable<NewApiToken> {
    return this.http.post<{ token: NewApiToken }>('/api/tokens', { name }).pipe(map((r) => r.token));
  }

  revoke(id: number): Observable<void> {
    return this.http.delete<void>(`/api/tokens/${id}`);
  }
}
