import { asc, eq } from 'drizzle-orm';
import type { Database } from '../db/client.ts';
import { comments, reports, series, users } from '../db/schema/index.ts';
import { notFound } from '../errors.ts';
import { touchProject } from './projects.ts';
import type { ReportComment } from '../../shared/sharing.ts';


/** What a comment is on: one report or one series. */
export type CommentTarget = { reportId: number } | { seriesId: number };

export async function listComments(db: Database, target: number | CommentTarget): Promise<ReportComment[]> {
  const on = typeof target === 'number' ? { reportId: target } : target;
  const rows = await db.select({ id: comments.id, body: comments.body, authorId: users.id, authorName: users.displayName, createdAt: comments.createdAt })
    .from(comments).innerJoin(users, eq(users.id, comments.userId))
    .where('reportId' in on ? eq(comments.reportId, on.reportId) : eq(comments.seriesId, on.seriesId))
    .orderBy(asc(comments.createdAt), asc(comments.id));
  return rows.map((r) => ({ id: r.id, body: r.body, author: { id: r.authorId, displayName: r.authorName }, createdAt: r.createdAt.toISOString() }));
}

export async function addComment(db: Database, target: number | CommentTarget, author: { id: number; displayName: string }, body: string): Promise<ReportComment> {
  const on = typeof target === 'number' ? { reportId: target } : target;
  const [owner] = 'reportId' in on
    ? await db.select({ projectId: reports.projectId }).from(reports).where(eq(reports.id, on.reportId))
    : await db.select({ projectId: series.projectId }).from(series).where(eq(series.id, on.seriesId));
  if (!owner) throw notFound('reportId' in on ? 'Report' : 'Series');
  const [{ id }] = await db.insert(comments).values({ ...on, userId: author.id, body }).$returningId();
  await touchProject(db, owner.projectId);
  const [row] = await db.select({ createdAt: comments.createdAt }).from(comments).where(eq(comments.id, id));
  return { id, body, author: { id: author.id, displayName: author.displayName }, createdAt: row!.createdAt.toISOString() };
}
