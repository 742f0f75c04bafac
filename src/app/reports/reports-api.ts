import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { map, type Observable } from 'rxjs';
import { commentSchema, newAccessLinkSchema, type NewAccessLink, type ReportComment } from '../../../shared/sharing';
import { unwrap } from '../core/api-envelope';

/** Writes around a report, one method per endpoint; pages read with httpResource. */
@Injectable({ providedIn: 'root' })
export class ReportsApi {
  private readonly http = inject(HttpClient);

  createLink(reportId: number, expiresInDays: number): Observable<NewAccessLink> {
    return this.http.post(`/api/reports/${reportId}/access-link`, { expiresInDays }).pipe(map(unwrap('link', newAccessLinkSchema)));
  }

  revokeLink(reportId: number, linkId: number): Observable<void> {
    return this.http.delete<void>(`/api/reports/${reportId}/access-links/${linkId}`);
  }

  addComment(reportId: number, body: string): Observable<ReportComment> {
    return this.http.post(`/api/reports/${reportId}/comments`, { body }).pipe(map(unwrap('comment', commentSchema)));
  }
}
