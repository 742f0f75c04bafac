import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { map, type Observable } from 'rxjs';

export interface AdminUser {
  id: number;
  email: string;
  displayName: string;
  role: 'admin' | 'member';
  disabled: boolean;
  createdAt: string;
}

export interface SentMail {
  id: string;
  to: string;
  subject: string;
  date: string | null;
  text: string;
}

@Injectable({ providedIn: 'root' })
export class AdminApi {
  private readonly http = inject(HttpClient);

  updateUser(id: number, changes: { role?: 'admin' | 'member'; disabled?: boolean }): Observable<AdminUser> {
    return this.http.patch<{ user: AdminUser }>(`/api/admin/users/${id}`, changes).pipe(map((r) => r.user));
  }
}
