import { spawn, type ChildProcess } from 'node:child_process';
import { Job } from 'bullmq';
import { eq, inArray } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { configToEnv } from '../../server/config.ts';
import { analysisRuns, projects, reports, trajectories, users } from '../../server/db/schema/index.ts';
import { startWorker } from '../../server/jobs/worker.ts';
import { startServer } from '../../server/main.ts';
import { freePort } from '../../scripts/services/wait-for-port.ts';
import { cancelRun, getRun, queueJobId, startRun } from '../../server/services/analysis-runs.ts';
import { jitteredCrystalExtxyz } from '../support/slow-trajectory.ts';
import { pollUntil } from '../support/poll.ts';
import { createTestApp } from '../support/test-app.ts';

// Workers here notice a dead peer's job within seconds instead of half a minute.
const testApp = createTestApp({ WORKER_STALLED_INTERVAL_MS: '2000', WORKER_LOCK_MS: '4000' });
const { ctx } = testApp;
let userId: number;
let trajectoryId: number;
/** Long enough to act on while it runs; the tests that end it early use it. */
const SLOW = ['msd', 'vacf', 'rdf', 'lindemann', 'ngp'] as const;
/** Still seconds of work, for the tests that wait for a run to finish. */
const MEDIUM = ['msd', 'vacf', 'rdf'] as const;

const runRow = async (id: number) => (await ctx.db.select().from(analysisRuns).where(eq(analysisRuns.id, id)))[0]!;

/** `npm run worker` as its own process, with this file's settings. */
function workerProcess(settings: Record<string, string> = {}): ChildProcess {
  return spawn(process.execPath, ['--import', 'tsx', 'server/jobs/worker-main.ts'], {
    env: { ...process.env, ...configToEnv(testApp.config), WORKER_CONCURRENCY: '1', LOG_LEVEL: 'warn', ...settings },
    stdio: ['ignore', 'ignore', 'inherit'],
  });
}

beforeAll(async () => {
  const [u] = await ctx.db.insert(users).values({ email: `lifecycle-${Date.now()}@lab.example`, displayName: 'Lifecycle', passwordHash: 'x' }).$returningId();
  userId = u.id;
  const [p] = await ctx.db.insert(projects).values({ name: 'Lifecycle', createdBy: userId, lastActivityAt: new Date() }).$returningId();
  const bytes = await jitteredCrystalExtxyz();
  const objectKey = `test/lifecycle-${Date.now()}/crystal.extxyz`;
  await ctx.store.putBytes(objectKey, bytes);
  const [t] = await ctx.db.insert(trajectories).values({
    projectId: p.id, uploadedBy: userId, name: 'crystal.extxyz', objectKey, sizeBytes: bytes.length, status: 'inspecting',
  }).$returningId();
  trajectoryId = t.id;
  const worker = await startWorker(testApp.config, ctx.log);
  await ctx.queue.add('inspect', { trajectoryId }, `inspect-${trajectoryId}`);
  await pollUntil(async () => (await ctx.db.select().from(trajectories).where(eq(trajectories.id, trajectoryId)))[0]!.status, (s) => s === 'ready');
  await worker.close();
}, 120_000);
afterAll(() => testApp.close());

const jobState = async (runId: number) => (await Job.fromId(ctx.queue.queue, queueJobId(runId)))?.getState();
const exitOf = (child: ChildProcess) => new Promise<number | null>((resolve) => child.once('exit', (code) => resolve(code)));

describe('an analysis job from queue to report', () => {
  it('when a queued job is cancelled before any worker takes it, then it never runs', async () => {
    const run = await startRun(ctx, trajectoryId, userId, ['msd'], {});
    const cancelled = await cancelRun(ctx, run.id);
    expect(cancelled.status).toBe('cancelled');
    const worker = await startWorker(testApp.config, ctx.log);
    try {
      // Jobs are taken in order: once a later one is done, the cancelled one had its chance.
      const later = await startRun(ctx, trajectoryId, userId, ['thermo'], {});
      expect((await pollUntil(() => runRow(later.id), (r) => r.status === 'done' || r.status === 'failed')).status).toBe('done');
      const row = await runRow(run.id);
      expect(row.status).toBe('cancelled');
      expect(row.startedAt).toBeNull();
      expect(row.reportId).toBeNull();
    } finally {
      await worker.close();
    }
  });

  it('when a running job is cancelled in the middle of an analysis, then the engine stops there, without a report, and the run stays cancelled', async () => {
    const worker = await startWorker(testApp.config, ctx.log);
    try {
      // One long stage: the cancel must land inside it.
      const run = await startRun(ctx, trajectoryId, userId, ['rdf'], {});
      await pollUntil(() => runRow(run.id), (r) => r.status === 'running' && r.progress >= 30, 60_000, 100);
      await cancelRun(ctx, run.id);
      expect(await pollUntil(() => jobState(run.id), (s) => s === 'completed' || s === 'failed', 60_000)).toBe('completed');
      // The engine reports progress to the queue as it goes: it never got near the end of the stage.
      expect(Number((await Job.fromId(ctx.queue.queue, queueJobId(run.id)))!.progress)).toBeLessThan(90);
      const row = await runRow(run.id);
      expect(row.status).toBe('cancelled');
      expect(row.reportId).toBeNull();
      expect(await ctx.db.select().from(reports).where(eq(reports.runId, run.id))).toEqual([]);
      await expect(cancelRun(ctx, run.id)).rejects.toThrow(/already been cancelled/);
    } finally {
      await worker.close();
    }
  }, 90_000);

  it('when the worker process dies mid-job, then another worker picks the job up and finishes it', async () => {
    const doomed = workerProcess();
    const run = await startRun(ctx, trajectoryId, userId, [...MEDIUM], {});
    const running = await pollUntil(() => runRow(run.id), (r) => r.status === 'running');
    expect(running.status).toBe('running');
    doomed.kill('SIGKILL');
    await exitOf(doomed);
    const rescuer = await startWorker(testApp.config, ctx.log);
    try {
      const finished = await pollUntil(() => getRun(ctx, run.id), (r) => r.status === 'done' || r.status === 'failed', 120_000);
      expect(finished.error).toBeNull();
      expect(finished.status).toBe('done');
      expect(finished.attempts).toBe(2);
      expect(finished.reportId).not.toBeNull();
    } finally {
      await rescuer.close();
    }
  }, 180_000);

  it('when a worker process gets SIGTERM and its grace period is over, then it hands the run back to the queue and another worker finishes it', async () => {
    const leaving = workerProcess({ WORKER_SHUTDOWN_GRACE_MS: '0' });
    const run = await startRun(ctx, trajectoryId, userId, [...MEDIUM], {});
    await pollUntil(() => runRow(run.id), (r) => r.status === 'running');
    leaving.kill('SIGTERM');
    expect(await exitOf(leaving)).toBe(0);
    expect(await runRow(run.id)).toMatchObject({ status: 'queued', progress: 0, claimToken: null, reportId: null });
    expect(await jobState(run.id)).toBe('waiting');
    const rescuer = await startWorker(testApp.config, ctx.log);
    try {
      const finished = await pollUntil(() => runRow(run.id), (r) => r.status === 'done' || r.status === 'failed', 120_000);
      expect(finished).toMatchObject({ status: 'done', error: null, attempts: 2 });
      expect(await ctx.db.select({ id: reports.id }).from(reports).where(eq(reports.runId, run.id))).toHaveLength(1);
    } finally {
      await rescuer.close();
    }
  }, 180_000);

  it('when a worker process gets SIGTERM within its grace period, then it finishes the running job before it exits', async () => {
    const leaving = workerProcess({ WORKER_SHUTDOWN_GRACE_MS: '600000' });
    const run = await startRun(ctx, trajectoryId, userId, [...MEDIUM], {});
    await pollUntil(() => runRow(run.id), (r) => r.status === 'running');
    leaving.kill('SIGTERM');
    expect(await exitOf(leaving)).toBe(0);
    const row = await runRow(run.id);
    expect(row).toMatchObject({ status: 'done', error: null, attempts: 1 });
    expect(row.reportId).not.toBeNull();
  }, 180_000);

  it('when two worker processes share the queue, then every run is claimed once and gets exactly one report', async () => {
    const workers = [workerProcess({ WORKER_CONCURRENCY: '2' }), workerProcess({ WORKER_CONCURRENCY: '2' })];
    try {
      const runs = await Promise.all(Array.from({ length: 8 }, () => startRun(ctx, trajectoryId, userId, ['thermo', 'msd'], {})));
      const ids = runs.map((r) => r.id);
      const rows = await pollUntil(
        () => ctx.db.select().from(analysisRuns).where(inArray(analysisRuns.id, ids)),
        (all) => all.every((r) => r.status === 'done' || r.status === 'failed'), 150_000,
      );
      expect(rows.map((r) => [r.status, r.attempts, r.error])).toEqual(ids.map(() => ['done', 1, null]));
      const stored = await ctx.db.select({ runId: reports.runId }).from(reports).where(inArray(reports.runId, ids));
      expect(stored.map((r) => r.runId).sort((a, b) => a - b)).toEqual([...ids].sort((a, b) => a - b));
    } finally {
      for (const w of workers) w.kill('SIGTERM');
      await Promise.all(workers.map(exitOf));
    }
  }, 200_000);

  it('when the web server\'s worker process crashes, then the API keeps answering and a new worker process takes the jobs', async () => {
    const server = await startServer({ ...testApp.config, PORT: await freePort(), RUN_WORKER: 'process' });
    try {
      const first = await pollUntil(async () => server.workerPid(), (pid) => pid !== null);
      process.kill(first!, 'SIGKILL');
      const health = await fetch(`${server.url}/api/health`);
      expect(health.status).toBe(200);
      const second = await pollUntil(async () => server.workerPid(), (pid) => pid !== null && pid !== first, 30_000);
      expect(second).not.toBe(first);
      const run = await startRun(ctx, trajectoryId, userId, ['thermo'], {});
      expect(await pollUntil(() => runRow(run.id), (r) => r.status === 'done' || r.status === 'failed', 120_000)).toMatchObject({ status: 'done' });
    } finally {
      await server.stop();
    }
  }, 180_000);
});

