import { and, eq } from 'drizzle-orm';
import type { Database } from '../db/client.ts';
import { analysisRuns, projectMembers, reports, series, trajectories, type ProjectRole, type TrajectoryRow } from '../db/schema/index.ts';
import type { ResourceKind } from '../routes/route-table.ts';

export interface Membership {
  projectId: number;
  role: ProjectRole;
  /** The trajectory itself, for a route reached via one, as read in the same query. */
  trajectory?: TrajectoryRow;
}

/** Tables of resources that belong to a project, by the kind a route names. */
const RESOURCE_TABLES = { report: reports, job: analysisRuns, series } as const;

/**
 * The project a resource belongs to and the user's role in it, in one
 * query; null when the resource does not exist or the user is not a member
 * (the caller answers both alike). Read afresh on every request, so a
 * removed member or a lowered role counts at once.
 */
export async function membershipVia(db: Database, kind: ResourceKind, id: number, userId: number): Promise<Membership | null> {
  if (kind === 'trajectory') {
    // The whole row, which trajectory routes need next anyway: one query where there would be two.
    const [row] = await db.select({ trajectory: trajectories, role: projectMembers.role }).from(trajectories)
      .innerJoin(projectMembers, and(eq(projectMembers.projectId, trajectories.projectId), eq(projectMembers.userId, userId)))
      .where(eq(trajectories.id, id));
    return row ? { projectId: row.trajectory.projectId, role: row.role, trajectory: row.trajectory } : null;
  }
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
