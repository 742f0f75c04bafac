import { and, desc, eq, gt, isNull } from 'drizzle-orm';
import { newSecretToken, sha256Hex } from '../auth/secret-token.ts';
import type { Database, Executor } from '../db/client.ts';
import { accessLinks, reports, users } from '../db/schema/index.ts';
import { notFound } from '../errors.ts';
import { recordAudit } from './audit.ts';
import type { AccessLinkRevocation, AccessLinkView, NewAccessLink } from '../../shared/sharing.ts';

/** A new link: its token, which is never stored, and its expiry (the route adds the address). */
export async function createAccessLink(
  db: Database, reportId: number, actorId: number, expiresInDays: number, now = new Date(),
): Promise<Omit<NewAccessLink, 'url'>> {
  const [report] = await db.select({ projectId: reports.projectId }).from(reports).where(eq(reports.id, reportId));
  if (!report) throw notFound('Report');
  const { token, hash } = newSecretToken();
  const expiresAt = new Date(now.getTime() + expiresInDays * 86_400_000);
  const [{ id }] = await db.insert(accessLinks).values({ projectId: report.projectId, reportId, tokenHash: hash, createdBy: actorId, expiresAt }).$returningId();
  await recordAudit(db, { projectId: report.projectId, actorId, action: 'access_link.created', details: { reportId, linkId: id, expiresAt: expiresAt.toISOString() } });
  return { id, reportId, token, expiresAt: expiresAt.toISOString() };
}

/** Every link of a report, revoked and expired ones included, so owners see the whole history. */
export async function listAccessLinks(db: Database, reportId: number): Promise<AccessLinkView[]> {
  const rows = await db.select({
    id: accessLinks.id, reportId: accessLinks.reportId, createdBy: users.displayName, createdAt: accessLinks.createdAt,
    expiresAt: accessLinks.expiresAt, revokedAt: accessLinks.revokedAt, revokedReason: accessLinks.revokedReason, lastUsedAt: accessLinks.lastUsedAt,
  }).from(accessLinks).innerJoin(users, eq(users.id, accessLinks.createdBy))
    .where(eq(accessLinks.reportId, reportId)).orderBy(desc(accessLinks.createdAt), desc(accessLinks.id));
  return rows.map((r) => ({
    ...r, createdAt: r.createdAt.toISOString(), expiresAt: r.expiresAt.toISOString(),
    revokedAt: r.revokedAt?.toISOString() ?? null, lastUsedAt: r.lastUsedAt?.toISOString() ?? null,
  }));
}

export async function revokeAccessLink(db: Database, reportId: number, actorId: number, linkId: number): Promise<void> {
  const [link] = await db.select().from(accessLinks).where(and(eq(accessLinks.id, linkId), eq(accessLinks.reportId, reportId)));
  if (!link) throw notFound('Access link');
  if (!link.revokedAt) await db.update(accessLinks).set({ revokedAt: new Date(), revokedReason: 'revoked' }).where(eq(accessLinks.id, linkId));
  await recordAudit(db, { projectId: link.projectId, actorId, action: 'access_link.revoked', details: { reportId, linkId } });
}

/**
 * Stops the working links one member made in one project (they left, were
 * removed, or can no longer share), with one audit entry per link. One step
 * of the membership change's transaction.
 */
export async function revokeLinksOfCreator(
  tx: Executor, projectId: number, actorId: number, creatorId: number, reason: Exclude<AccessLinkRevocation, 'revoked'>, now = new Date(),
): Promise<number> {
  const live = await tx.select({ id: accessLinks.id, reportId: accessLinks.reportId }).from(accessLinks)
    .where(and(eq(accessLinks.projectId, projectId), eq(accessLinks.createdBy, creatorId), isNull(accessLinks.revokedAt))).for('update');
  for (const link of live) {
    await tx.update(accessLinks).set({ revokedAt: now, revokedReason: reason }).where(eq(accessLinks.id, link.id));
    await recordAudit(tx, { projectId, actorId, action: 'access_link.revoked', details: { reportId: link.reportId, linkId: link.id, reason, creatorId } });
  }
  return live.length;
}

/**
 * The report a valid link points at. Unknown, expired and revoked tokens all
 * answer the same 404, so a guessed token learns nothing.
 */
export async function resolveAccessLink(db: Database, token: string, now = new Date()): Promise<{ reportId: number; expiresAt: Date }> {
  const [link] = await db.select().from(accessLinks)
    .where(and(eq(accessLinks.tokenHash, sha256Hex(token)), isNull(accessLinks.revokedAt), gt(accessLinks.expiresAt, now)));
  if (!link) throw notFound('Access link');
  await db.update(accessLinks).set({ lastUsedAt: now }).where(eq(accessLinks.id, link.id));
  return { reportId: link.reportId, expiresAt: link.expiresAt };
}
