import { Job } from 'bullmq';
import { and, desc, eq, inArray } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createContext } from '../../server/bootstrap.ts';
import { analysisRuns, projects, reports, trajectories, users } from '../../server/db/schema/index.ts';
import { requeueStranded } from '../../server/jobs/requeue-stranded.ts';
import {
  cancelRun, claimRun, completeRun, failRun, queueJobId, recordProgress, releaseRun, RunLost, startRun,
} from '../../server/services/analysis-runs.ts';
import { freePort } from '../../scripts/services/wait-for-port.ts';
import { createTestApp } from '../support/test-app.ts';

// No worker runs in this file: each test plays the worker's part itself, so
// it can put a user's action exactly between two of the worker's steps.
const testApp = createTestApp();
const { ctx } = testApp;
let userId: number;
let trajectoryId: number;

const runRow = async (id: number) => (await ctx.db.select().from(analysisRuns).where(eq(analysisRuns.id, id)))[0]!;
const reportsOf = async (runId: number) => ctx.db.select({ id: reports.id }).from(reports).where(eq(reports.runId, runId));
const reportValues = (title: string) => ({
  title, analyses: ['thermo'], params: {}, summary: {}, methods: {}, curvesKey: `test/${title}.json.gz`, engineVersion: 'test', inputSha256: null,
});
const newRun = () => startRun(ctx, trajectoryId, userId, ['thermo'], {});

beforeAll(async () => {
  const [u] = await ctx.db.insert(users).values({ email: `run-state-${Date.now()}@lab.example`, displayName: 'Run state', passwordHash: 'x' }).$returningId();
  userId = u.id;
  const [p] = await ctx.db.insert(projects).values({ name: 'Run state', createdBy: userId, lastActivityAt: new Date() }).$returningId();
  const [t] = await ctx.db.insert(trajectories).values({
    projectId: p.id, uploadedBy: userId, name: 'argon.extxyz', objectKey: `test/run-state-${Date.now()}/argon.extxyz`,
    sizeBytes: 1, status: 'ready', atoms: 4, frames: 10, timeStep: 0.01,
  }).$returningId();
  trajectoryId = t.id;
});
afterAll(async () => {
  // Leave no queued work behind for the workers of later test files.
  const open = await ctx.db.select({ id: analysisRuns.id }).from(analysisRuns)
    .where(and(eq(analysisRuns.trajectoryId, trajectoryId), inArray(analysisRuns.status, ['queued', 'running'])));
  for (const { id } of open) await cancelRun(ctx, id);
  await testApp.close();
});

describe('an analysis run has one owner for its state', () => {
  it('when a cancel lands before any worker claims the run, then the claim fails and the run stays cancelled', async () => {
    const run = await newRun();
    await cancelRun(ctx, run.id);
    expect(await claimRun(ctx, run.id, 'worker-a')).toBeNull();
    const row = await runRow(run.id);
    expect(row.status).toBe('cancelled');
    expect(row.startedAt).toBeNull();
    expect(await Job.fromId(ctx.queue.queue, queueJobId(run.id))).toBeUndefined();
  });

  it('when a cancel lands after the claim, then the next progress write stops the worker and completion leaves no report', async () => {
    const run = await newRun();
    const claimed = await claimRun(ctx, run.id, 'worker-a');
    expect(claimed?.status).toBe('running');
    await cancelRun(ctx, run.id);
    await expect(recordProgress(ctx, run.id, 'worker-a', 50)).rejects.toThrow(RunLost);
    expect(await completeRun(ctx, claimed!, 'worker-a', reportValues('late'))).toBeNull();
    expect(await reportsOf(run.id)).toEqual([]);
    expect((await runRow(run.id)).status).toBe('cancelled');
  });

  it('when a cancel and a completion race, then the run ends in one state and has a report exactly when it is done', async () => {
    for (let k = 0; k < 12; k++) {
      const run = await newRun();
      const claimed = (await claimRun(ctx, run.id, `w-${k}`))!;
      const [cancel, reportId] = await Promise.allSettled([cancelRun(ctx, run.id), completeRun(ctx, claimed, `w-${k}`, reportValues(`race-${k}`))]);
      const row = await runRow(run.id);
      const stored = await reportsOf(run.id);
      expect(['done', 'cancelled']).toContain(row.status);
      if (row.status === 'done') {
        expect(cancel.status).toBe('rejected');
        expect(stored.map((r) => r.id)).toEqual([row.reportId]);
      } else {
        expect(reportId).toEqual({ status: 'fulfilled', value: null });
        expect(stored).toEqual([]);
      }
    }
  });

  it('when a second attempt claims a running run, then the first can neither record progress, fail, release nor finish it', async () => {
    const run = await newRun();
    const first = (await claimRun(ctx, run.id, 'attempt-1'))!;
    const second = (await claimRun(ctx, run.id, 'attempt-2'))!;
    expect(second.attempts).toBe(2);
    await expect(recordProgress(ctx, run.id, 'attempt-1', 10)).rejects.toMatchObject({ status: 'taken over' });
    expect(await failRun(ctx, run.id, 'attempt-1', 'stale failure')).toBe(false);
    expect(await releaseRun(ctx, run.id, 'attempt-1')).toBe(false);
    expect(await completeRun(ctx, first, 'attempt-1', reportValues('stale'))).toBeNull();
    const reportId = await completeRun(ctx, second, 'attempt-2', reportValues('fresh'));
    expect(reportId).not.toBeNull();
    expect(await reportsOf(run.id)).toEqual([{ id: reportId }]);
    expect(await runRow(run.id)).toMatchObject({ status: 'done', reportId, error: null });
  });

  it('when a finished run is cancelled, then the cancel is refused and the run keeps its report', async () => {
    const run = await newRun();
    const claimed = (await claimRun(ctx, run.id, 'w'))!;
    const reportId = await completeRun(ctx, claimed, 'w', reportValues('kept'));
    await expect(cancelRun(ctx, run.id)).rejects.toThrow(/already finished/);
    expect(await runRow(run.id)).toMatchObject({ status: 'done', reportId });
  });

  it('when a worker releases its run, then the run is queued again and the next claim counts a new attempt', async () => {
    const run = await newRun();
    await claimRun(ctx, run.id, 'leaving');
    await recordProgress(ctx, run.id, 'leaving', 40);
    expect(await releaseRun(ctx, run.id, 'leaving')).toBe(true);
    expect(await runRow(run.id)).toMatchObject({ status: 'queued', progress: 0, claimToken: null });
    expect((await claimRun(ctx, run.id, 'arriving'))?.attempts).toBe(2);
  });

  it('when the queue cannot be reached, then starting answers 503 and the run is failed rather than left queued', async () => {
    const deadRedis = await freePort();
    const offline = createContext({ ...testApp.config, REDIS_URL: `redis://127.0.0.1:${deadRedis}`, QUEUE_ADD_TIMEOUT_MS: 300 });
    try {
      const error = await startRun(offline, trajectoryId, userId, ['thermo'], {}).catch((err: unknown) => err);
      expect(error).toMatchObject({ status: 503, code: 'queue_unavailable' });
      const [latest] = await ctx.db.select().from(analysisRuns).where(eq(analysisRuns.trajectoryId, trajectoryId)).orderBy(desc(analysisRuns.id)).limit(1);
      expect(latest).toMatchObject({ status: 'failed', error: expect.stringMatching(/queue could not be reached/) });
      // Should the job reach Redis after all, its worker finds nothing to do.
      expect(await claimRun(ctx, latest!.id, 'late')).toBeNull();
    } finally {
      await offline.close();
    }
  });

  it('when a run lost its queue entry, then the sweep queues it again once, however many workers sweep', async () => {
    const queued = await newRun();
    const running = await newRun();
    await claimRun(ctx, running.id, 'vanished-worker');
    for (const id of [queued.id, running.id]) await (await Job.fromId(ctx.queue.queue, queueJobId(id)))!.remove();
    const sweeps = await Promise.all([requeueStranded(ctx, 0), requeueStranded(ctx, 0)]);
    expect(sweeps.reduce((n, s) => n + s.runs, 0)).toBeGreaterThanOrEqual(2);
    for (const id of [queued.id, running.id]) {
      expect(await (await Job.fromId(ctx.queue.queue, queueJobId(id)))?.getState()).toBe('waiting');
      expect(await runRow(id)).toMatchObject({ status: 'queued', claimToken: null });
    }
    const waiting = await ctx.queue.queue.getJobs(['waiting']);
    expect(waiting.filter((j) => j.id === queueJobId(queued.id))).toHaveLength(1);
  });
});
