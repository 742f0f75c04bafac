/**
 * The one owner of an analysis run's state. Every change names the state it
 * leaves in its WHERE clause, so when a user, a worker and a second worker
 * act at once exactly one of them wins, and the losers learn it from the
 * number of rows they changed:
 *
 *   queued ──claim──▶ running ──complete──▶ done (with its report, in one transaction)
 *     │   ◀──release──  │  ──fail──▶ failed
 *     └─────cancel──────┴──cancel──▶ cancelled
 *
 * A running run belongs to one claim (a job id and the queue's lock token of
 * that attempt): progress, completion, failure and release are accepted only
 * from the claim that holds it, so a worker that lost its job to another
 * (its lock lapsed) cannot overwrite the newer attempt's work.
 */
import { Job } from 'bullmq';
import { and, desc, eq, inArray, sql } from 'drizzle-orm';
import type { AnalysisRunDto } from '../../shared/analysis-run.ts';
import type { AnalysisKey, AnalysisParamsInput } from '../../shared/analysis-params.ts';
import type { AppContext } from '../context.ts';
import { analysisRuns, reports, users } from '../db/schema/index.ts';
import { AppError, conflict, notFound } from '../errors.ts';
import { assertAffordable, planFor } from './run-costs.ts';
import { getTrajectoryRow, touchProject } from './trajectories.ts';
import { queueFrameStore } from './trajectory-frames.ts';

type RunRow = typeof analysisRuns.$inferSelect;
type NewReport = Omit<typeof reports.$inferInsert, 'id' | 'runId' | 'projectId' | 'trajectoryId' | 'createdAt'>;

function toDto(row: RunRow, requesterName: string): AnalysisRunDto {
  return {
    id: row.id, projectId: row.projectId, trajectoryId: row.trajectoryId, analyses: row.analyses, params: row.params, notes: row.notes,
    status: row.status, progress: row.progress, attempts: row.attempts, error: row.error, reportId: row.reportId,
    requestedBy: { id: row.requestedBy, displayName: requesterName },
    createdAt: row.createdAt.toISOString(), startedAt: row.startedAt?.toISOString() ?? null, finishedAt: row.finishedAt?.toISOString() ?? null,
  };
}

export const queueJobId = (runId: number) => `run-${runId}`;

const changed = (result: [{ affectedRows: number }, ...unknown[]]) => result[0].affectedRows === 1;

export async function startRun(
  ctx: AppContext, trajectoryId: number, userId: number, analyses: AnalysisKey[], paramsInput: AnalysisParamsInput, notes = '',
): Promise<AnalysisRunDto> {
  const trajectory = await getTrajectoryRow(ctx, trajectoryId);
  // Stored with every default filled in (stride, g(r) range, energy inputs), so the run records exactly what the engine will use.
  const costed = await planFor(ctx, trajectory, analyses, paramsInput);
  assertAffordable(costed);
  const { params } = costed.plan;
  const [{ id }] = await ctx.db.insert(analysisRuns).values({
    projectId: trajectory.projectId, trajectoryId, requestedBy: userId, analyses: [...new Set(analyses)], params, notes, status: 'queued',
  }).$returningId();
  const jobId = queueJobId(id);
  try {
    await ctx.queue.add('analyse', { runId: id }, jobId);
  } catch (err) {
    // The row must not wait for a job that was never queued. Should the add
    // reach Redis after all, its worker finds the run failed and skips it.
    const reason = err instanceof Error ? err.message : String(err);
    ctx.log.error({ runId: id, err: reason }, 'could not queue an analysis run');
    await ctx.db.update(analysisRuns).set({ status: 'failed', error: 'The job queue could not be reached; start the analysis again.', finishedAt: new Date() })
      .where(and(eq(analysisRuns.id, id), eq(analysisRuns.status, 'queued')));
    throw new AppError(503, 'queue_unavailable', 'The job queue cannot be reached right now, so the analysis was not started. Try again in a minute.');
  }
  await ctx.db.update(analysisRuns).set({ queueJobId: jobId }).where(eq(analysisRuns.id, id));
  // Inspected before the frame store existed: this run reads the text, and the store written after it spares the next one.
  if (!trajectory.frameStoreKey) queueFrameStore(ctx, trajectory.id);
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

/** The project's latest runs, newest first: what the project page lists, whoever started them and from wherever. */
export async function listProjectRuns(ctx: AppContext, projectId: number, limit = 100): Promise<AnalysisRunDto[]> {
  const rows = await ctx.db.select({ r: analysisRuns, name: users.displayName }).from(analysisRuns)
    .innerJoin(users, eq(users.id, analysisRuns.requestedBy))
    .where(eq(analysisRuns.projectId, projectId)).orderBy(desc(analysisRuns.id)).limit(limit);
  return rows.map((r) => toDto(r.r, r.name));
}

/**
 * A user's cancel: wins over whatever a worker does next, because every
 * later worker write requires the run to be running. A queued run also
 * leaves the queue at once; a running one stops at its worker's next checkpoint.
 */
export async function cancelRun(ctx: AppContext, id: number): Promise<AnalysisRunDto> {
  const result = await ctx.db.update(analysisRuns).set({ status: 'cancelled', finishedAt: new Date(), error: 'Cancelled by a user.', claimToken: null })
    .where(and(eq(analysisRuns.id, id), inArray(analysisRuns.status, ['queued', 'running'])));
  if (!changed(result)) {
    const row = await getRunRow(ctx, id);
    throw conflict(`The job has already ${row.status === 'done' ? 'finished' : row.status === 'failed' ? 'failed' : 'been cancelled'}.`);
  }
  const job = await Job.fromId(ctx.queue.queue, queueJobId(id)).catch(() => undefined);
  const state = await job?.getState().catch(() => undefined);
  if (job && state && ['waiting', 'delayed', 'prioritized', 'waiting-children'].includes(state)) await job.remove().catch(() => {});
  return getRun(ctx, id);
}

/** Why a worker must stop working on a run it had claimed. */
export class RunLost extends Error {
  constructor(readonly runId: number, readonly status: RunRow['status'] | 'deleted' | 'taken over') {
    super(`Run ${runId} is ${status}; this attempt stops.`);
    this.name = 'RunLost';
  }
}

/**
 * A worker takes a run for one attempt. Succeeds from queued, and from
 * running when the queue handed the job on because the previous attempt's
 * worker stopped renewing its lock. Returns null when the run is no longer
 * wanted (cancelled, done, failed or deleted).
 */
export async function claimRun(ctx: AppContext, runId: number, claimToken: string): Promise<RunRow | null> {
  const result = await ctx.db.update(analysisRuns).set({
    status: 'running', claimToken, progress: 0, error: null,
    attempts: sql`${analysisRuns.attempts} + 1`, startedAt: sql`COALESCE(${analysisRuns.startedAt}, NOW(3))`,
  }).where(and(eq(analysisRuns.id, runId), inArray(analysisRuns.status, ['queued', 'running'])));
  if (!changed(result)) return null;
  return getRunRow(ctx, runId);
}

const heldBy = (runId: number, claimToken: string) =>
  and(eq(analysisRuns.id, runId), eq(analysisRuns.status, 'running'), eq(analysisRuns.claimToken, claimToken));

/** Why a claim no longer holds its run. */
export async function runLostReason(ctx: AppContext, runId: number): Promise<RunLost> {
  const [row] = await ctx.db.select({ status: analysisRuns.status }).from(analysisRuns).where(eq(analysisRuns.id, runId));
  return new RunLost(runId, !row ? 'deleted' : row.status === 'running' ? 'taken over' : row.status);
}

/** Records progress; throws RunLost when the run was cancelled, deleted or taken over meanwhile. */
export async function recordProgress(ctx: AppContext, runId: number, claimToken: string, percent: number): Promise<void> {
  const progress = Math.max(0, Math.min(99, Math.round(percent)));
  if (!changed(await ctx.db.update(analysisRuns).set({ progress }).where(heldBy(runId, claimToken)))) throw await runLostReason(ctx, runId);
}

/**
 * Stores the report and marks the run done in one transaction, only while
 * this claim still holds the run: a cancel that landed first leaves no
 * report behind. Returns the report id, or null when the run was lost.
 */
export async function completeRun(ctx: AppContext, run: RunRow, claimToken: string, report: NewReport): Promise<number | null> {
  return ctx.db.transaction(async (tx) => {
    const [current] = await tx.select({ status: analysisRuns.status, claimToken: analysisRuns.claimToken }).from(analysisRuns)
      .where(eq(analysisRuns.id, run.id)).for('update');
    if (current?.status !== 'running' || current.claimToken !== claimToken) return null;
    const [{ id: reportId }] = await tx.insert(reports).values({
      ...report, runId: run.id, projectId: run.projectId, trajectoryId: run.trajectoryId,
    }).$returningId();
    await tx.update(analysisRuns).set({ status: 'done', progress: 100, reportId, finishedAt: new Date(), claimToken: null })
      .where(heldBy(run.id, claimToken));
    return reportId;
  });
}

/** Marks the run failed with a message for the user, if this claim still holds it. */
export async function failRun(ctx: AppContext, runId: number, claimToken: string, message: string): Promise<boolean> {
  return changed(await ctx.db.update(analysisRuns).set({ status: 'failed', error: message.slice(0, 4000), finishedAt: new Date(), claimToken: null })
    .where(heldBy(runId, claimToken)));
}

/** Hands a running run back to the queue (a worker shutting down), if this claim still holds it. */
export async function releaseRun(ctx: AppContext, runId: number, claimToken: string): Promise<boolean> {
  return changed(await ctx.db.update(analysisRuns).set({ status: 'queued', progress: 0, claimToken: null })
    .where(heldBy(runId, claimToken)));
}
