import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { analysisRuns, projects, reports, trajectories, users } from '../../server/db/schema/index.ts';
import { startWorker, type RunningWorker } from '../../server/jobs/worker.ts';
import { decodeCurves } from '../../server/services/report-curves.ts';
import { startRun } from '../../server/services/analysis-runs.ts';
import { lennardJonesExtxyz } from '../support/fixtures.ts';
import { pollUntil } from '../support/poll.ts';
import { createTestApp } from '../support/test-app.ts';

const testApp = createTestApp();
const { ctx } = testApp;
let worker: RunningWorker;
let userId: number;
let projectId: number;

async function storedTrajectory(name: string, bytes: Buffer): Promise<number> {
  const objectKey = `test/${Date.now()}-${Math.random().toString(36).slice(2)}/${name}`;
  await ctx.store.putBytes(objectKey, bytes);
  const [{ id }] = await ctx.db.insert(trajectories).values({
    projectId, uploadedBy: userId, name, objectKey, sizeBytes: bytes.length, status: 'inspecting', timeUnit: 'ps',
  }).$returningId();
  await ctx.queue.add('inspect', { trajectoryId: id }, `inspect-${id}`);
  return id;
}

const rowOf = async (id: number) => (await ctx.db.select().from(trajectories).where(eq(trajectories.id, id)))[0]!;

beforeAll(async () => {
  worker = await startWorker(testApp.config, ctx.log);
  const [u] = await ctx.db.insert(users).values({ email: `jobs-${Date.now()}@lab.example`, displayName: 'Job tester', passwordHash: 'x' }).$returningId();
  userId = u.id;
  const [p] = await ctx.db.insert(projects).values({ name: 'Jobs', createdBy: userId, lastActivityAt: new Date() }).$returningId();
  projectId = p.id;
});

afterAll(async () => {
  await worker.close();
  await testApp.close();
});

describe('the job worker (BullMQ in worker threads)', () => {
  it('when a valid extended XYZ is stored, then inspection fills in atoms, frames, species, cell, velocities and time step', async () => {
    const { run, bytes } = await lennardJonesExtxyz();
    const id = await storedTrajectory('argon.extxyz', bytes);
    const row = await pollUntil(() => rowOf(id), (r) => r.status !== 'inspecting');
    expect(row.error).toBeNull();
    expect(row.status).toBe('ready');
    expect(row.atoms).toBe(run.trajectory.nAtoms);
    expect(row.frames).toBe(run.trajectory.nFrames);
    expect(row.speciesCounts).toEqual({ Ar: run.trajectory.nAtoms });
    expect(row.hasVelocities).toBe(true);
    expect(row.cellChanges).toBe(false);
    expect(row.timeStep).toBeCloseTo(run.trajectory.times[1]! - run.trajectory.times[0]!, 9);
    expect(row.fromFile).toContain('timeStep');
  });

  it('when a file is malformed, then only that trajectory fails, with a message naming file, frame and line', async () => {
    const good = await storedTrajectory('fine.xyz', Buffer.from('2\nok\nAr 0 0 0\nAr 1 1 1\n'));
    const bad = await storedTrajectory('broken.xyz', Buffer.from('2\nfirst\nAr 0 0 0\nAr 1 1 1\n2\nsecond\nAr 0 0 0\nAr 1 x 1\n'));
    const badRow = await pollUntil(() => rowOf(bad), (r) => r.status !== 'inspecting');
    const goodRow = await pollUntil(() => rowOf(good), (r) => r.status !== 'inspecting');
    expect(badRow.status).toBe('failed');
    expect(badRow.error).toMatch(/broken\.xyz/);
    expect(badRow.error).toMatch(/frame 2/);
    expect(badRow.error).toMatch(/line 8/);
    expect(goodRow.status).toBe('ready');
  });

  it('when a coordinate is 1e39, beyond what a 32-bit float holds, then inspection fails naming file, frame, line and value, and no frame store is kept', async () => {
    const id = await storedTrajectory('far-away.xyz', Buffer.from('2\nfirst\nAr 0 0 0\nAr 1 1 1\n2\nsecond\nAr 0 0 0\nAr 1e39 1 1\n'));
    const row = await pollUntil(() => rowOf(id), (r) => r.status !== 'inspecting');
    expect(row.status).toBe('failed');
    expect(row.error).toMatch(/^far-away\.xyz, frame 2, line 8: atom 2 has position x = 1e\+39, which is not a finite number a 32-bit float can hold/);
    expect(row.frameStoreKey).toBeNull();
  });

  it('when an analysis run is queued, then it runs, mirrors progress to its row and stores a report with curves', async () => {
    const { bytes } = await lennardJonesExtxyz();
    const id = await storedTrajectory('liquid.extxyz', bytes);
    await pollUntil(() => rowOf(id), (r) => r.status !== 'inspecting');
    const run = await startRun(ctx, id, userId, ['thermo', 'msd', 'vacf', 'rdf'], {});
    const readRun = async () => (await ctx.db.select().from(analysisRuns).where(eq(analysisRuns.id, run.id)))[0]!;
    const done = await pollUntil(readRun, (r) => r.status === 'done' || r.status === 'failed', 120_000);
    expect(done.error).toBeNull();
    expect(done.status).toBe('done');
    expect(done.progress).toBe(100);
    const [report] = await ctx.db.select().from(reports).where(eq(reports.id, done.reportId!));
    expect(report!.inputSha256).toBeNull();
    expect(Object.keys(report!.summary).sort()).toEqual(['msd', 'rdf', 'thermo', 'vacf']);
    const curves = decodeCurves(await ctx.store.getBytes(report!.curvesKey));
    expect(Object.keys(curves).sort()).toEqual(['msd', 'rdf', 'thermo', 'vacf']);
    expect(curves['msd']!.columns[0]).toBe('lag');
  });

  it('when a worker may hold no coordinates in memory, then the run reads them from its scratch file and reports exactly what the in-memory run reports', async () => {
    const { bytes } = await lennardJonesExtxyz();
    const id = await storedTrajectory('scratch.extxyz', bytes);
    await pollUntil(() => rowOf(id), (r) => r.status !== 'inspecting');
    const readRun = async (runId: number) => (await ctx.db.select().from(analysisRuns).where(eq(analysisRuns.id, runId)))[0]!;
    const summaryOf = async () => {
      const run = await startRun(ctx, id, userId, ['thermo', 'msd', 'vacf', 'vdos', 'rdf'], {});
      const done = await pollUntil(() => readRun(run.id), (r) => r.status === 'done' || r.status === 'failed', 120_000);
      expect(done.error).toBeNull();
      return (await ctx.db.select().from(reports).where(eq(reports.id, done.reportId!)))[0]!.summary;
    };
    const inMemory = await summaryOf();
    await worker.close();
    worker = await startWorker({ ...testApp.config, ANALYSIS_IN_MEMORY_BYTES: 0 }, ctx.log);
    expect(await summaryOf()).toEqual(inMemory);
  });
});
