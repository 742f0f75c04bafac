import { asc, eq } from 'drizzle-orm';
import type { Database } from '../db/client.ts';
import { comments, reports, users } from '../db/schema/index.ts';
import { notFound } from '../errors.ts';
import { touchProject } from './projects.ts';
import type { ReportComment } from '../../shared/sharing.ts';


export async function listComments(db: Database, reportId: number): Promise<ReportComment[]> {
  const rows = await db.select({ id: comments.id, body: comments.body, authorId: users.id, authorName: users.displayName, createdAt: comments.createdAt })
    .from(comments).innerJoin(users, eq(users.id, comments.userId)).where(eq(comments.reportId, reportId))
    .orderBy(asc(comments.createdAt), asc(comments.id));
  return rows.map((r) => ({ id: r.id, body: r.body, author: { id: r.authorId, displayName: r.authorName }, createdAt: r.createdAt.toISOString() }));
}

export async function addComment(db: Database, reportId: number, author: { id: number; displayName: string }, body: string): Promise<ReportComment> {
  const [report] = await db.select({ projectId: reports.projectId }).from(reports).where(eq(reports.id, reportId));
  if (!report) throw notFound('Report');
  const [{ id }] = await db.insert(comments).values({ reportId, userId: author.id, body }).$returningId();
  await touchProject(db, report.projectId);
  const [row] = await db.select({ createdAt: comments.createdAt }).from(comments).where(eq(comments.id, id));
  return { id, body, author: { id: author.id, displayName: author.displayName }, createdAt: row!.createdAt.toISOString() };
}
