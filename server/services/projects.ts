import { and, desc, eq, sql } from 'drizzle-orm';
import type { AppContext } from '../context.ts';
import type { Database } from '../db/client.ts';
import { projectPrefix } from '../storage/object-keys.ts';
import { projectMembers, projects, type ProjectRole } from '../db/schema/index.ts';
import { AppError, notFound } from '../errors.ts';
import { recordAudit } from './audit.ts';
import type { ProjectSummary } from '../../shared/projects.ts';


const memberCount = sql<number>`(SELECT COUNT(*) FROM project_members pm WHERE pm.project_id = ${projects.id})`.mapWith(Number);
const storageBytes = sql<number>`(SELECT COALESCE(SUM(t.size_bytes + t.frame_store_bytes), 0) FROM trajectories t WHERE t.project_id = ${projects.id})`.mapWith(Number);

function summaryQuery(db: Database, userId: number) {
  return db.select({
    id: projects.id, name: projects.name, description: projects.description, role: projectMembers.role,
    memberCount, storageBytes, createdAt: projects.createdAt, lastActivityAt: projects.lastActivityAt,
  }).from(projects).innerJoin(projectMembers, and(eq(projectMembers.projectId, projects.id), eq(projectMembers.userId, userId)));
}

function toSummary(row: Awaited<ReturnType<typeof summaryQuery>>[number]): ProjectSummary {
  return { ...row, createdAt: row.createdAt.toISOString(), lastActivityAt: row.lastActivityAt.toISOString() };
}

/** The projects the user belongs to, most recently active first. */
export async function listProjects(db: Database, userId: number): Promise<ProjectSummary[]> {
  return (await summaryQuery(db, userId).orderBy(desc(projects.lastActivityAt), desc(projects.id))).map(toSummary);
}

export async function getProject(db: Database, projectId: number, userId: number): Promise<ProjectSummary> {
  const [row] = await summaryQuery(db, userId).where(eq(projects.id, projectId));
  if (!row) throw notFound('Project');
  return toSummary(row);
}

export interface ProjectFields {
  name: string;
  description: string;
}

export async function createProject(db: Database, userId: number, fields: ProjectFields): Promise<ProjectSummary> {
  const projectId = await db.transaction(async (tx) => {
    const [{ id }] = await tx.insert(projects).values({ ...fields, createdBy: userId, lastActivityAt: new Date() }).$returningId();
    await tx.insert(projectMembers).values({ projectId: id, userId, role: 'owner' });
    return id;
  });
  await recordAudit(db, { projectId, actorId: userId, action: 'project.created', details: { name: fields.name } });
  return getProject(db, projectId, userId);
}

export async function updateProject(db: Database, projectId: number, actorId: number, changes: Partial<ProjectFields>): Promise<ProjectSummary> {
  await db.update(projects).set({ ...changes, lastActivityAt: new Date() }).where(eq(projects.id, projectId));
  await recordAudit(db, { projectId, actorId, action: 'project.updated', details: { ...changes } });
  return getProject(db, projectId, actorId);
}

/**
 * Deletes a project and everything in it, once the caller has typed its
 * exact name. The rows and the audit entry go in one transaction; the
 * project's folder in the object store is emptied before (so a store that
 * is down stops the delete before anything is lost) and after (for objects
 * a job wrote meanwhile).
 */
export async function deleteProject(ctx: AppContext, projectId: number, actorId: number, confirmName: string): Promise<void> {
  const { db } = ctx;
  const [project] = await db.select({ name: projects.name }).from(projects).where(eq(projects.id, projectId));
  if (!project) throw notFound('Project');
  if (confirmName !== project.name) {
    throw new AppError(400, 'confirmation_mismatch', `confirm: type the project's name exactly ("${project.name}") to delete it.`,
      [{ field: 'confirm', message: 'does not match the project name' }]);
  }
  await ctx.store.deletePrefix(projectPrefix(projectId));
  await db.transaction(async (tx) => {
    await tx.delete(projects).where(eq(projects.id, projectId));
    await recordAudit(tx, { projectId, actorId, action: 'project.deleted', details: { name: project.name } });
  });
  await ctx.store.deletePrefix(projectPrefix(projectId));
}

/** Marks the project as just used, for the "last activity" column. */
export async function touchProject(db: Database, projectId: number): Promise<void> {
  await db.update(projects).set({ lastActivityAt: new Date() }).where(eq(projects.id, projectId));
}
