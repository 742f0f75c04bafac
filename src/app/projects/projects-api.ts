import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { map, type Observable } from 'rxjs';
import type { InvitationFacts, Member, PendingInvitation, ProjectRole, ProjectSummary } from './project-types';

/** Writes to the project endpoints, one method each; pages read with httpResource. */
@Injectable({ providedIn: 'root' })
export class ProjectsApi {
  private readonly http = inject(HttpClient);

  create(name: string, description: string): Observable<ProjectSummary> {
    return this.http.post<{ project: ProjectSummary }>('/api/projects', { name, description }).pipe(map((r) => r.project));
  }

  update(id: number, changes: { name?: string; description?: string }): Observable<ProjectSummary> {
    return this.http.patch<{ project: ProjectSummary }>(`/api/projects/${id}`, changes).pipe(map((r) => r.project));
  }

  delete(id: number, confirm: string): Observable<void> {
    return this.http.delete<void>(`/api/projects/${id}`, { body: { confirm } });
  }

  changeRole(projectId: number, userId: number, role: ProjectRole): Observable<Member[]> {
    return this.http.patch<{ members: Member[] }>(`/api/projects/${projectId}/members/${userId}`, { role }).pipe(map((r) => r.members));
  }

  removeMember(projectId: number, userId: number): Observable<void> {
    return this.http.delete<void>(`/api/projects/${projectId}/members/${userId}`);
  }

  invite(projectId: number, email: string, role: ProjectRole): Observable<PendingInvitation> {
    return this.http.post<{ invitation: PendingInvitation }>(`/api/projects/${projectId}/invitations`, { email, role }).pipe(map((r) => r.invitation));
  }

  revokeInvitation(projectId: number, invitationId: number): Observable<void> {
    return this.http.delete<void>(`/api/projects/${projectId}/invitations/${invitationId}`);
  }

  describeInvitation(token: string): Observable<InvitationFacts> {
    return this.http.get<{ invitation: InvitationFacts }>(`/api/invitations/${encodeURIComponent(token)}`).pipe(map((r) => r.invitation));
  }

  acceptInvitation(token: string): Observable<{ projectId: number }> {
    return this.http.post<{ projectId: number }>(`/api/invitations/${encodeURIComponent(token)}/accept`, {});
  }
}
