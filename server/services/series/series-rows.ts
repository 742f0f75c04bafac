/** The series tables: rows in, rows out, and the checks that keep a series one system of one project. */
import { and, asc, eq, inArray } from 'drizzle-orm';
import type { AppContext } from '../../context.ts';
import { series, seriesMembers, trajectories, users, type TrajectoryRow } from '../../db/schema/index.ts';
import { AppError, notFound } from '../../errors.ts';

export type SeriesRow = typeof series.$inferSelect;
export type MemberRow = typeof seriesMembers.$inferSelect;

export async function seriesRow(ctx: AppContext, id: number): Promise<SeriesRow & { creatorName: string }> {
  const [row] = await ctx.db.select({ s: series, creatorName: users.displayName }).from(series)
    .innerJoin(users, eq(users.id, series.createdBy)).where(eq(series.id, id));
  if (!row) throw notFound('Series');
  return { ...row.s, creatorName: row.creatorName };
}

export async function memberRows(ctx: AppContext, seriesId: number): Promise<(MemberRow & { trajectory: TrajectoryRow })[]> {
  const rows = await ctx.db.select({ m: seriesMembers, t: trajectories }).from(seriesMembers)
    .innerJoin(trajectories, eq(trajectories.id, seriesMembers.trajectoryId))
    .where(eq(seriesMembers.seriesId, seriesId)).orderBy(asc(seriesMembers.position), asc(seriesMembers.trajectoryId));
  return rows.map((r) => ({ ...r.m, trajectory: r.t }));
}

const invalid = (field: string, message: string) => new AppError(400, 'invalid_input', `${field}: ${message}`, [{ field, message }]);

const speciesOf = (t: TrajectoryRow): string[] => Object.keys(t.speciesCounts ?? {}).sort();

/**
 * The trajectories named in `field`, each in the project, read and of the
 * same species as `reference` (the series' other members): a series compares
 * one system across state points. Each refusal is a 400 naming the field and
 * the trajectory.
 */
export async function checkedTrajectories(
  ctx: AppContext, projectId: number, ids: readonly number[], field: string, reference: readonly TrajectoryRow[] = [],
): Promise<TrajectoryRow[]> {
  if (ids.length === 0) return [];
  const rows = await ctx.db.select().from(trajectories).where(and(eq(trajectories.projectId, projectId), inArray(trajectories.id, [...ids])));
  const byId = new Map(rows.map((r) => [r.id, r]));
  const absent = ids.filter((id) => !byId.has(id));
  if (absent.length) throw invalid(field, `no trajectory ${absent.join(', ')} in this project`);
  const ordered = ids.map((id) => byId.get(id) as TrajectoryRow);
  for (const t of ordered) {
    if (t.status !== 'ready') {
      throw invalid(field, t.status === 'failed' ? `${t.name} (${t.id}) could not be read, so it cannot join a series` : `${t.name} (${t.id}) is still ${t.status === 'uploading' ? 'uploading' : 'being inspected'}; add it once it is ready`);
    }
  }
  const all = [...reference, ...ordered];
  const first = all[0]!;
  const system = speciesOf(first).join(', ');
  for (const t of all) {
    if (speciesOf(t).join(', ') !== system) {
      throw invalid(field, `a series compares one system: ${t.name} (${t.id}) has species ${speciesOf(t).join(', ') || 'none'}, ${first.name} (${first.id}) has ${system || 'none'}`);
    }
  }
  return ordered;
}

export { invalid as invalidField };
