/** Shapes of the project endpoints' answers, as the server sends them. */
export type ProjectRole = 'owner' | 'editor' | 'viewer';
export const PROJECT_ROLES: readonly ProjectRole[] = ['owner', 'editor', 'viewer'];

export interface ProjectSummary {
  id: number;
  name: string;
  description: string;
  /** The signed-in user's role in the project. */
  role: ProjectRole;
  memberCount: number;
  createdAt: string;
  lastActivityAt: string;
}

export interface Member {
  userId: number;
  email: string;
  displayName: string;
  role: ProjectRole;
  joinedAt: string;
}

export interface PendingInvitation {
  id: number;
  email: string;
  role: ProjectRole;
  invitedBy: string;
  createdAt: string;
  expiresAt: string;
}

export interface InvitationFacts {
  projectName: string;
  email: string;
  role: ProjectRole;
  invitedBy: string;
  expiresAt: string;
}

export interface AuditEntry {
  id: number;
  action: string;
  details: Record<string, unknown>;
  actor: { id: number; displayName: string; email: string } | null;
  createdAt: string;
}

/** What each role may do, in words for the members panel and invitation page. */
export const ROLE_MEANING: Record<ProjectRole, string> = {
  owner: 'manages members and can delete the project',
  editor: 'uploads, edits metadata, runs analyses, makes access links',
  viewer: 'reads reports and comments',
};
