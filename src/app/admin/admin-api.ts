import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { map, type Observable } from 'rxjs';
import { adminUserSchema, type AdminUser, type AdminUserChanges } from '../../../shared/admin';
import { unwrap } from '../core/api-envelope';

@Injectable({ providedIn: 'root' })
export class AdminApi {
  private readonly http = inject(HttpClient);

  updateUser(id: number, changes: AdminUserChanges): Observable<AdminUser> {
    return this.http.patch(`/api/admin/users/${id}`, changes).pipe(map(unwrap('user', adminUserSchema)));
  }
}
