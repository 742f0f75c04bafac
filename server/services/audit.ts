import { desc, eq } from 'drizzle-orm';
import type { Database, Executor } from '../db/client.ts';
import { auditLog, users } from '../db/schema/index.ts';
import type { AuditEntry as AuditEntryView } from '../../shared/projects.ts';

export type AuditAction =
  | 'project.created' | 'project.updated' | 'project.deleted'
  | 'member.role_changed' | 'member.removed' | 'member.left' | 'member.joined'
  | 'invitation.sent' | 'invitation.revoked'
  | 'token.created' | 'token.revoked'
  | 'access_link.created' | 'access_link.revoked'
  | 'series.created' | 'series.deleted'
  | 'user.role_changed' | 'user.disabled' | 'user.enabled' | 'user.password_reset';

export interface AuditEntry {
  projectId: number | null;
  actorId: number | null;
  action: AuditAction;
  details: Record<string, unknown>;
}

export async function recordAudit(db: Executor, entry: AuditEntry): Promise<void> {
  await db.insert(auditLog).values(entry);
}


/** The latest entries of one project, newest first. */
export async function listProjectAudit(db: Database, projectId: number, limit = 200): Promise<AuditEntryView[]> {
  const rows = await db.select({
    id: auditLog.id, action: auditLog.action, details: auditLog.details, createdAt: auditLog.createdAt,
    actorId: users.id, actorName: users.displayName, actorEmail: users.email,
  }).from(auditLog).leftJoin(users, eq(users.id, auditLog.actorId))
    .where(eq(auditLog.projectId, projectId)).orderBy(desc(auditLog.createdAt), desc(auditLog.id)).limit(limit);
  return rows.map((r) => ({
    id: r.id, action: r.action, details: r.details, createdAt: r.createdAt.toISOString(),
    actor: r.actorId === null ? null : { id: r.actorId, displayName: r.actorName ?? '', email: r.actorEmail ?? '' },
  }));
}
