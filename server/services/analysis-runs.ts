import { Job } from 'bullmq';
import { desc, eq } from 'drizzle-orm';
import type { AnalysisRunDto } from '../../shared/analysis-run.ts';
import { analysisParamsSchema, type AnalysisKey, type AnalysisParamsInput } from '../../shared/analysis-params.ts';
import type { AppContext } from '../context.ts';
import { analysisRuns, users } from '../db/schema/index.ts';
import { conflict, notFound } from '../errors.ts';
import { getTrajectoryRow, touchProject } from './trajectories.ts';

type RunRow = typeof analysisRuns.$inferSelect;

function toDto(row: RunRow, requesterName: string): AnalysisRunDto {
  return {
    id: row.id, projectId: row.projectId, trajectoryId: row.trajectoryId, analyses: row.analyses, params: row.params,
    status: row.status, progress: row.progress, attempts: row.attempts, error: row.error, reportId: row.reportId,
    requestedBy: { id: row.requestedBy, displayName: requesterName },
    createdAt: row.createdAt.toISOString(), startedAt: row.startedAt?.toISOString() ?? null, finishedAt: row.finishedAt?.toISOString() ?? null,
  };
}

export const queueJobId = (runId: number) => `run-${runId}`;

export async function startRun(
  ctx: AppContext, trajectoryId: number, userId: number, analyses: AnalysisKey[], paramsInput: AnalysisParamsInput,
): Promise<AnalysisRunDto> {
  // Stored with every default filled in, so the run records exactly what the engine will use.
  const params = analysisParamsSchema.parse(paramsInput);
  const trajectory = await getTrajectoryRow(ctx, trajectoryId);
  if (trajectory.status !== 'ready') {
    throw conflict(`The trajectory is ${trajectory.status}; analyses can start once it is ready.`);
  }
  if (!trajectory.timeStep) {
    throw conflict(`${trajectory.name} states no time between frames: set "Time between frames" in its metadata first.`);
  }
  const [{ id }] = await ctx.db.insert(analysisRuns).values({
    projectId: trajectory.projectId, trajectoryId, requestedBy: userId, analyses: [...new Set(analyses)], params, status: 'queued',
  }).$returningId();
  const jobId = await ctx.queue.add('analyse', { runId: id }, queueJobId(id));
  await ctx.db.update(analysisRuns).set({ queueJobId: jobId }).where(eq(analysisRuns.id, id));
  await touchProject(ctx, trajectory.projectId);
  return getRun(ctx, id);
}

export async function getRunRow(ctx: AppContext, id: number): Promise<RunRow> {
  const [row] = await ctx.db.select().from(analysisRuns).where(eq(analysisRuns.id, id));
  if (!row) throw notFound('Job');
  return row;
}

export async function getRun(ctx: AppContext, id: number): Promise<AnalysisRunDto> {
  const [row] = await ctx.db.select({ r: analysisRuns, name: users.displayName }).from(analysisRuns)
    .innerJoin(users, eq(users.id, analysisRuns.requestedBy)).where(eq(analysisRuns.id, id));
  if (!row) throw notFound('Job');
  return toDto(row.r, row.name);
}

export async function listRuns(ctx: AppContext, trajectoryId: number): Promise<AnalysisRunDto[]> {
  const rows = await ctx.db.select({ r: analysisRuns, name: users.displayName }).from(analysisRuns)
    .innerJoin(users, eq(users.id, analysisRuns.requestedBy))
    .where(eq(analysisRuns.trajectoryId, trajectoryId)).orderBy(desc(analysisRuns.id)).limit(100);
  return rows.map((r) => toDto(r.r, r.name));
}

/**
 * A queued run leaves the queue at once; a running one is marked cancelled
 * and its worker stops at the next checkpoint (it checks this row).
 */
export async function cancelRun(ctx: AppContext, id: number): Promise<AnalysisRunDto> {
  const row = await getRunRow(ctx, id);
  if (row.status === 'done' || row.status === 'failed' || row.status === 'cancelled') {
    throw conflict(`The job has already ${row.status === 'done' ? 'finished' : row.status === 'failed' ? 'failed' : 'been cancelled'}.`);
  }
  await ctx.db.update(analysisRuns).set({ status: 'cancelled', finishedAt: new Date(), error: 'Cancelled by a user.' })
    .where(eq(analysisRuns.id, id));
  if (row.queueJobId) {
    const job = await Job.fromId(ctx.queue.queue, row.queueJobId);
    const state = await job?.getState();
    if (job && state && ['waiting', 'delayed', 'prioritized', 'waiting-children'].includes(state)) await job.remove().catch(() => {});
  }
  return getRun(ctx, id);
}
