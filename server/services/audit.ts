import { desc, eq, inArray } from 'drizzle-orm';
import type { Database, Executor } from '../db/client.ts';
import { auditLog, reports, series, users } from '../db/schema/index.ts';
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
  const reportTitles = await namesById(db, 'report', rows.map((r) => idIn(r.details, 'reportId')));
  const seriesNames = await namesById(db, 'series', rows.map((r) => idIn(r.details, 'seriesId')));
  const memberNames = await namesById(db, 'user', rows.map((r) => idIn(r.details, 'userId')));
  return rows.map((r) => ({
    id: r.id, action: r.action, details: r.details, createdAt: r.createdAt.toISOString(),
    actor: r.actorId === null ? null : { id: r.actorId, displayName: r.actorName ?? '', email: r.actorEmail ?? '' },
    names: {
      report: reportTitles.get(idIn(r.details, 'reportId') ?? -1) ?? null,
      series: seriesNames.get(idIn(r.details, 'seriesId') ?? -1) ?? null,
      member: memberNames.get(idIn(r.details, 'userId') ?? -1) ?? null,
    },
  }));
}

function idIn(details: Record<string, unknown>, key: string): number | null {
  const value = details[key];
  return typeof value === 'number' && Number.isInteger(value) ? value : null;
}

/** Current report titles, series names or display names for the ids the entries mention, in one query each. */
async function namesById(db: Database, kind: 'report' | 'series' | 'user', ids: (number | null)[]): Promise<Map<number, string>> {
  const wanted = [...new Set(ids.filter((id): id is number => id !== null))];
  if (wanted.length === 0) return new Map();
  const rows = kind === 'report'
    ? await db.select({ id: reports.id, name: reports.title }).from(reports).where(inArray(reports.id, wanted))
    : kind === 'series'
      ? await db.select({ id: series.id, name: series.name }).from(series).where(inArray(series.id, wanted))
      : await db.select({ id: users.id, name: users.displayName }).from(users).where(inArray(users.id, wanted));
  return new Map(rows.map((r) => [r.id, r.name]));
}
