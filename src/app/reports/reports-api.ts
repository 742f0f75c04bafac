import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { map, type Observable } from 'rxjs';
import { z } from 'zod';
import { commentSchema, newAccessLinkSchema, type ReportComment } from '../../../shared/sharing';
import { unwrap } from '../core/api-envelope';
import { targetPath, type ShareTarget } from './share-target';

/** A link just made, to a report or a series: shown once, with its address. */
const newLinkSchema = newAccessLinkSchema.pick({ id: true, token: true, url: true, expiresAt: true });
export type NewLink = z.infer<typeof newLinkSchema>;

/** Writes around a report or a series (links, comments), one method per endpoint; pages read with httpResource. */
@Injectable({ providedIn: 'root' })
export class ReportsApi {
  private readonly http = inject(HttpClient);

  /** A new access link to a report or a series; only its token and address differ from the list's rows. */
  createLink(target: ShareTarget, expiresInDays: number): Observable<NewLink> {
    return this.http.post(`${targetPath(target)}/access-link`, { expiresInDays }).pipe(map(unwrap('link', newLinkSchema)));
  }

  revokeLink(target: ShareTarget, linkId: number): Observable<void> {
    return this.http.delete<void>(`${targetPath(target)}/access-links/${linkId}`);
  }

  addComment(target: ShareTarget, body: string): Observable<ReportComment> {
    return this.http.post(`${targetPath(target)}/comments`, { body }).pipe(map(unwrap('comment', commentSchema)));
  }
}
