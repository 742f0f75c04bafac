import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { map, type Observable } from 'rxjs';
import {
  invitationFactsSchema, memberSchema, pendingInvitationSchema, projectSchema,
  type InvitationFacts, type Member, type PendingInvitation, type ProjectChanges, type ProjectRole, type ProjectSummary,
} from '../../../shared/projects';
import { unwrap, unwrapList } from '../core/api-envelope';

const readProject = unwrap('project', projectSchema);

/** Writes to the project endpoints, one method each; pages read with httpResource. */
@Injectable({ providedIn: 'root' })
export class ProjectsApi {
  private readonly http = inject(HttpClient);

  create(name: string, description: string): Observable<ProjectSummary> {
    return this.http.post('/api/projects', { name, description }).pipe(map(readProject));
  }

  update(id: number, changes: ProjectChanges): Observable<ProjectSummary> {
    return this.http.patch(`/api/projects/${id}`, changes).pipe(map(readProject));
  }

  delete(id: number, confirm: string): Observable<void> {
    return this.http.delete<void>(`/api/projects/${id}`, { body: { confirm } });
  }

  changeRole(projectId: number, userId: number, role: ProjectRole): Observable<Member[]> {
    return this.http.patch(`/api/projects/${projectId}/members/${userId}`, { role }).pipe(map(unwrapList('members', memberSchema)));
  }

  removeMember(projectId: number, userId: number): Observable<void> {
    return this.http.delete<void>(`/api/projects/${projectId}/members/${userId}`);
  }

  invite(projectId: number, email: string, role: ProjectRole): Observable<PendingInvitation> {
    return this.http.post(`/api/projects/${projectId}/invitations`, { email, role }).pipe(map(unwrap('invitation', pendingInvitationSchema)));
  }

  revokeInvitation(projectId: number, invitationId: number): Observable<void> {
    return this.http.delete<void>(`/api/projects/${projectId}/invitations/${invitationId}`);
  }

  describeInvitation(token: string): Observable<InvitationFacts> {
    return this.http.get(`/api/invitations/${encodeURIComponent(token)}`).pipe(map(unwrap('invitation', invitationFactsSchema)));
  }

  /** Joins the project the invitation is for, and answers that project. */
  acceptInvitation(token: string): Observable<ProjectSummary> {
    return this.http.post(`/api/invitations/${encodeURIComponent(token)}/accept`, {}).pipe(map(readProject));
  }
}
