import { and, desc, eq, gt, isNull } from 'drizzle-orm';
import { newSecretToken, sha256Hex } from '../auth/secret-token.ts';
import type { Database, Executor } from '../db/client.ts';
import { accessLinks, reports, series, users } from '../db/schema/index.ts';
import { AppError, notFound } from '../errors.ts';
import { recordAudit } from './audit.ts';
import type { AccessLinkRevocation, AccessLinkView, NewAccessLink } from '../../shared/sharing.ts';
import type { NewSeriesAccessLink, SeriesAccessLinkView } from '../../shared/series-api.ts';

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
    id: accessLinks.id, createdBy: users.displayName, createdAt: accessLinks.createdAt,
    expiresAt: accessLinks.expiresAt, revokedAt: accessLinks.revokedAt, revokedReason: accessLinks.revokedReason, lastUsedAt: accessLinks.lastUsedAt,
  }).from(accessLinks).innerJoin(users, eq(users.id, accessLinks.createdBy))
    .where(eq(accessLinks.reportId, reportId)).orderBy(desc(accessLinks.createdAt), desc(accessLinks.id));
  return rows.map((r) => ({
    ...r, reportId, createdAt: r.createdAt.toISOString(), expiresAt: r.expiresAt.toISOString(),
    revokedAt: r.revokedAt?.toISOString() ?? null, lastUsedAt: r.lastUsedAt?.toISOString() ?? null,
  }));
}

/** A new link to a series, as for a report. */
export async function createSeriesAccessLink(
  db: Database, seriesId: number, actorId: number, expiresInDays: number, now = new Date(),
): Promise<Omit<NewSeriesAccessLink, 'url'>> {
  const [row] = await db.select({ projectId: series.projectId }).from(series).where(eq(series.id, seriesId));
  if (!row) throw notFound('Series');
  const { token, hash } = newSecretToken();
  const expiresAt = new Date(now.getTime() + expiresInDays * 86_400_000);
  const [{ id }] = await db.insert(accessLinks).values({ projectId: row.projectId, seriesId, tokenHash: hash, createdBy: actorId, expiresAt }).$returningId();
  await recordAudit(db, { projectId: row.projectId, actorId, action: 'access_link.created', details: { seriesId, linkId: id, expiresAt: expiresAt.toISOString() } });
  return { id, seriesId, token, expiresAt: expiresAt.toISOString() };
}

export async function listSeriesAccessLinks(db: Database, seriesId: number): Promise<SeriesAccessLinkView[]> {
  const rows = await db.select({
    id: accessLinks.id, createdBy: users.displayName, createdAt: accessLinks.createdAt,
    expiresAt: accessLinks.expiresAt, revokedAt: accessLinks.revokedAt, revokedReason: accessLinks.revokedReason, lastUsedAt: accessLinks.lastUsedAt,
  }).from(accessLinks).innerJoin(users, eq(users.id, accessLinks.createdBy))
    .where(eq(accessLinks.seriesId, seriesId)).orderBy(desc(accessLinks.createdAt), desc(accessLinks.id));
  return rows.map((r) => ({
    ...r, seriesId, createdAt: r.createdAt.toISOString(), expiresAt: r.expiresAt.toISOString(),
    revokedAt: r.revokedAt?.toISOString() ?? null, lastUsedAt: r.lastUsedAt?.toISOString() ?? null,
  }));
}

export async function revokeSeriesAccessLink(db: Database, seriesId: number, actorId: number, linkId: number): Promise<void> {
  const [link] = await db.select().from(accessLinks).where(and(eq(accessLinks.id, linkId), eq(accessLinks.seriesId, seriesId)));
  if (!link) throw notFound('Access link');
  if (!link.revokedAt) await db.update(accessLinks).set({ revokedAt: new Date(), revokedReason: 'revoked' }).where(eq(accessLinks.id, linkId));
  await recordAudit(db, { projectId: link.projectId, actorId, action: 'access_link.revoked', details: { seriesId, linkId } });
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
  const live = await tx.select({ id: accessLinks.id, reportId: accessLinks.reportId, seriesId: accessLinks.seriesId }).from(accessLinks)
    .where(and(eq(accessLinks.projectId, projectId), eq(accessLinks.createdBy, creatorId), isNull(accessLinks.revokedAt))).for('update');
  for (const link of live) {
    await tx.update(accessLinks).set({ revokedAt: now, revokedReason: reason }).where(eq(accessLinks.id, link.id));
    await recordAudit(tx, { projectId, actorId, action: 'access_link.revoked', details: { ...(link.seriesId !== null ? { seriesId: link.seriesId } : { reportId: link.reportId }), linkId: link.id, reason, creatorId } });
  }
  return live.length;
}

/**
 * The report or series a valid link points at (exactly one is set). Unknown, expired and revoked tokens all
 * answer the same 404, so a guessed token learns nothing.
 */
export async function resolveAccessLink(db: Database, token: string, now = new Date()): Promise<{ reportId: number | null; seriesId: number | null; expiresAt: Date }> {
  const [link] = await db.select().from(accessLinks)
    .where(and(eq(accessLinks.tokenHash, sha256Hex(token)), isNull(accessLinks.revokedAt), gt(accessLinks.expiresAt, now)));
  if (!link) throw notFound('Access link');
  await db.update(accessLinks).set({ lastUsedAt: now }).where(eq(accessLinks.id, link.id));
  return { reportId: link.reportId, seriesId: link.seriesId, expiresAt: link.expiresAt };
}

/** A valid link to a report: a series link is a 404 on the report-only link routes. */
export async function resolveReportLink(db: Database, token: string): Promise<{ reportId: number; expiresAt: Date }> {
  const link = await resolveAccessLink(db, token);
  if (link.reportId === null) throw new AppError(404, 'not_found', 'This link shares a series, not a report.');
  return { reportId: link.reportId, expiresAt: link.expiresAt };
}
