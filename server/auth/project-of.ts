import { and, eq } from 'drizzle-orm';
import type { Database } from '../db/client.ts';
import { analysisRuns, projectMembers, reports, series, trajectories, type ProjectRole } from '../db/schema/index.ts';
import type { ResourceKind } from '../routes/route-table.ts';

/** Tables of resources that belong to a project, by the kind a route names. */
const RESOURCE_TABLES = { trajectory: trajectories, report: reports, job: analysisRuns, series } as const;

/**
 * The project a resource belongs to and the user's role in it, in one
 * query; null when the resource does not exist or the user is not a member
 * (the caller answers both alike). Read afresh on every request, so a
 * removed member or a lowered role counts at once.
 */
export async function membershipVia(db: Database, kind: ResourceKind, id: number, userId: number): Promise<{ projectId: number; role: ProjectRole } | null> {
  if (kind === 'project') {
    const [row] = await db.select({ projectId: projectMembers.projectId, role: projectMembers.role }).from(projectMembers)
      .where(and(eq(projectMembers.projectId, id), eq(projectMembers.userId, userId)));
    return row ?? null;
  }
  const table = RESOURCE_TABLES[kind];
  const [row] = await db.select({ projectId: table.projectId, role: projectMembers.role }).from(table)
    .innerJoin(projectMembers, and(eq(projectMembers.projectId, table.projectId), eq(projectMembers.userId, userId)))
    .where(eq(table.id, id));
  return row ?? null;
}
