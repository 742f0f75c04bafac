import { spawn, type ChildProcess } from 'node:child_process';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { analysisRuns, projects, trajectories, users } from '../../server/db/schema/index.ts';
import { startWorker, type RunningWorker } from '../../server/jobs/worker.ts';
import { cancelRun, getRun, startRun } from '../../server/services/analysis-runs.ts';
import { jitteredCrystalExtxyz } from '../support/slow-trajectory.ts';
import { pollUntil } from '../support/poll.ts';
import { createTestApp } from '../support/test-app.ts';

// Workers here notice a dead peer's job within seconds instead of half a minute.
const testApp = createTestApp({ WORKER_STALLED_INTERVAL_MS: '2000', WORKER_LOCK_MS: '4000' });
const { ctx } = testApp;
let userId: number;
let trajectoryId: number;
const SLOW = ['msd', 'vacf', 'rdf', 'lindemann', 'ngp'] as const;

const runRow = async (id: number) => (await ctx.db.select().from(analysisRuns).where(eq(analysisRuns.id, id)))[0]!;

function workerProcess(): ChildProcess {
  return spawn(process.execPath, ['--import', 'tsx', 'server/jobs/worker-main.ts'], {
    env: { ...process.env, WORKER_STALLED_INTERVAL_MS: '2000', WORKER_LOCK_MS: '4000', WORKER_CONCURRENCY: '1', LOG_LEVEL: 'warn' },
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

describe('an analysis job from queue to report', () => {
  it('when a queued job is cancelled before any worker takes it, then it never runs', async () => {
    const run = await startRun(ctx, trajectoryId, userId, ['msd'], {});
    const cancelled = await cancelRun(ctx, run.id);
    expect(cancelled.status).toBe('cancelled');
    const worker = await startWorker(testApp.config, ctx.log);
    try {
      await new Promise((r) => setTimeout(r, 1500));
      const row = await runRow(run.id);
      expect(row.status).toBe('cancelled');
      expect(row.startedAt).toBeNull();
      expect(row.reportId).toBeNull();
    } finally {
      await worker.close();
    }
  });

  it('when a running job is cancelled, then it stops without a report and stays cancelled', async () => {
    const worker = await startWorker(testApp.config, ctx.log);
    try {
      const run = await startRun(ctx, trajectoryId, userId, [...SLOW], {});
      await pollUntil(() => runRow(run.id), (r) => r.status === 'running');
      await cancelRun(ctx, run.id);
      await new Promise((r) => setTimeout(r, 8000));
      const row = await runRow(run.id);
      expect(row.status).toBe('cancelled');
      expect(row.reportId).toBeNull();
      await expect(cancelRun(ctx, run.id)).rejects.toThrow(/already been cancelled/);
    } finally {
      await worker.close();
    }
  }, 60_000);

  it('when the worker process dies mid-job, then another worker picks the job up and finishes it', async () => {
    const doomed = workerProcess();
    const run = await startRun(ctx, trajectoryId, userId, [...SLOW], {});
    const running = await pollUntil(() => runRow(run.id), (r) => r.status === 'running');
    expect(running.status).toBe('running');
    doomed.kill('SIGKILL');
    await new Promise((r) => doomed.once('exit', r));
    const rescuer = await startWorker(testApp.config, ctx.log);
    try {
      const finished = await pollUntil(() => getRun(ctx, run.id), (r) => r.status === 'done' || r.status === 'failed', 120_000);
      expect(finished.error).toBeNull();
      expect(finished.status).toBe('done');
      expect(finished.attempts).toBeGreaterThanOrEqual(1);
      expect(finished.reportId).not.toBeNull();
    } finally {
      await rescuer.close();
    }
  }, 180_000);
});
