/**
 * Work whose queue entry is gone is queued again: a Redis that restarted
 * without its data, or a process that died between writing a run's row and
 * queueing its job, must not leave a run or an inspection waiting forever.
 * Job ids are fixed per run and per trajectory, so workers sweeping at the
 * same time cannot queue anything twice.
 */
import { Job } from 'bullmq';
import { and, eq, inArray, lt, sql } from 'drizzle-orm';
import type { AppContext } from '../context.ts';
import { analysisRuns, trajectories } from '../db/schema/index.ts';
import { queueJobId } from '../services/analysis-runs.ts';

/** Rows younger than this are left alone: their request may still be queueing them. */
const SETTLE_MS = 30_000;

export interface Requeued {
  runs: number;
  inspections: number;
}

async function jobState(ctx: AppContext, id: string): Promise<{ job: Job; state: string } | null> {
  const job = await Job.fromId(ctx.queue.queue, id);
  if (!job) return null;
  return { job, state: await job.getState() };
}

export async function requeueStranded(ctx: AppContext, settleMs = SETTLE_MS): Promise<Requeued> {
  const cutoff = new Date(Date.now() - settleMs);
  const out: Requeued = { runs: 0, inspections: 0 };
  const runs = await ctx.db.select({ id: analysisRuns.id, status: analysisRuns.status }).from(analysisRuns)
    .where(and(inArray(analysisRuns.status, ['queued', 'running']), lt(analysisRuns.createdAt, cutoff)));
  for (const run of runs) {
    const found = await jobState(ctx, queueJobId(run.id));
    if (found?.state === 'failed') {
      // The queue gave up before any attempt could claim the run (say, the database was down throughout).
      await ctx.db.update(analysisRuns).set({ status: 'failed', error: found.job.failedReason || 'The job failed before it could start.', finishedAt: new Date(), claimToken: null })
        .where(and(eq(analysisRuns.id, run.id), inArray(analysisRuns.status, ['queued', 'running'])));
      continue;
    }
    if (found && found.state !== 'completed') continue;
    if (found) await found.job.remove();
    // The attempt that held a running run is gone with its job; the run starts over.
    await ctx.db.update(analysisRuns).set({ status: 'queued', progress: 0, claimToken: null })
      .where(and(eq(analysisRuns.id, run.id), eq(analysisRuns.status, 'running')));
    await ctx.queue.add('analyse', { runId: run.id }, queueJobId(run.id));
    out.runs++;
  }
  const inspecting = await ctx.db.select({ id: trajectories.id }).from(trajectories)
    .where(and(eq(trajectories.status, 'inspecting'), lt(sql`COALESCE(${trajectories.updatedAt}, ${trajectories.createdAt})`, cutoff)));
  for (const { id } of inspecting) {
    const found = await jobState(ctx, `inspect-${id}`);
    if (found?.state === 'failed') {
      await ctx.db.update(trajectories).set({ status: 'failed', error: found.job.failedReason || 'Inspection failed.', updatedAt: new Date() })
        .where(and(eq(trajectories.id, id), eq(trajectories.status, 'inspecting')));
      continue;
    }
    if (found && found.state !== 'completed') continue;
    if (found) await found.job.remove();
    await ctx.queue.add('inspect', { trajectoryId: id }, `inspect-${id}`);
    out.inspections++;
  }
  return out;
}
