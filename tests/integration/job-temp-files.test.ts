import { mkdtemp, readdir, readFile, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { Job } from 'bullmq';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { analysisRuns, projects, trajectories, users } from '../../server/db/schema/index.ts';
import { startWorker, type RunningWorker } from '../../server/jobs/worker.ts';
import { cancelRun, queueJobId, startRun } from '../../server/services/analysis-runs.ts';
import { makeSystem, writeH5md } from '../unit/formats/synthetic.ts';
import { jitteredCrystalExtxyz } from '../support/slow-trajectory.ts';
import { pollUntil } from '../support/poll.ts';
import { createTestApp, type TestApp } from '../support/test-app.ts';

/**
 * Jobs keep their temporary copies (H5MD inside gzip) in a folder of their
 * own under JOB_TEMP_DIR, capped by JOB_TEMP_MAX_BYTES; the folder is empty
 * again after a job that succeeds, fails on its file, hits the cap or is
 * cancelled.
 */
const TEMP_CAP = 64 * 1024;
let root: string;
let testApp: TestApp;
let worker: RunningWorker;
let userId: number;
let projectId: number;
let fixtures: string;

const rowOf = async (id: number) => (await testApp.ctx.db.select().from(trajectories).where(eq(trajectories.id, id)))[0]!;
const jobState = async (jobId: string) => (await Job.fromId(testApp.ctx.queue.queue, jobId))?.getState();

async function inspected(name: string, bytes: Buffer) {
  const { ctx } = testApp;
  const objectKey = `test/temp-files-${Date.now()}-${Math.random().toString(36).slice(2)}/${name}`;
  await ctx.store.putBytes(objectKey, bytes);
  const [{ id }] = await ctx.db.insert(trajectories).values({
    projectId, uploadedBy: userId, name, objectKey, sizeBytes: bytes.length, status: 'inspecting', timeUnit: 'ps',
  }).$returningId();
  await ctx.queue.add('inspect', { trajectoryId: id }, `inspect-${id}`);
  // The job has ended (and its folder gone) once the queue says so, not merely when the row changes.
  const state = await pollUntil(() => jobState(`inspect-${id}`), (s) => s === 'completed' || s === 'failed', 60_000);
  expect(state === 'completed' || state === 'failed').toBe(true);
  return rowOf(id);
}

/** An H5MD inside gzip; `still` repeats the first frame, which gzip shrinks many times over, as a hostile upload would. */
async function h5md(name: string, atoms: number, frames: number, still = false): Promise<Buffer> {
  const system = makeSystem(atoms, frames);
  if (still) {
    system.positions = system.positions.map(() => system.positions[0]!);
    system.velocities = system.velocities.map(() => system.velocities[0]!);
  }
  await writeH5md(join(fixtures, name), system);
  return gzipSync(await readFile(join(fixtures, name)));
}

beforeAll(async () => {
  root = await mkdtemp(join(tmpdir(), 'ergodic-job-temp-root-'));
  fixtures = await mkdtemp(join(tmpdir(), 'ergodic-job-temp-fixtures-'));
  testApp = createTestApp({ JOB_TEMP_DIR: root, JOB_TEMP_MAX_BYTES: String(TEMP_CAP) });
  worker = await startWorker(testApp.config, testApp.ctx.log);
  const { ctx } = testApp;
  const [u] = await ctx.db.insert(users).values({ email: `temp-files-${Date.now()}@lab.example`, displayName: 'Temp files', passwordHash: 'x' }).$returningId();
  userId = u.id;
  const [p] = await ctx.db.insert(projects).values({ name: 'Temp files', createdBy: userId, lastActivityAt: new Date() }).$returningId();
  projectId = p.id;
});

afterAll(async () => {
  await worker.close();
  await testApp.close();
  await rm(root, { recursive: true, force: true });
  await rm(fixtures, { recursive: true, force: true });
});

describe('temporary files of jobs', () => {
  it('when an H5MD inside gzip under the cap is inspected, then it is ready and the temp folder is empty', async () => {
    const row = await inspected('small.h5.gz', await h5md('small.h5', 20, 10));
    expect([row.status, row.error]).toEqual(['ready', null]);
    expect([row.atoms, row.frames]).toEqual([20, 10]);
    expect(await readdir(root)).toEqual([]);
  });

  it('when an H5MD inside gzip would need a temp copy past JOB_TEMP_MAX_BYTES, then inspection fails naming the file and the limit, and the folder is empty', async () => {
    // Smaller than the cap as uploaded; several times larger once expanded.
    const big = await h5md('big.h5', 400, 40, true);
    expect(big.length).toBeLessThan(TEMP_CAP);
    const row = await inspected('big.h5.gz', big);
    expect(row.status).toBe('failed');
    expect(row.error).toMatch(new RegExp(`^big\\.h5\\.gz: HDF5 data needs a temporary copy of more than ${TEMP_CAP} bytes \\(64 KiB, the temporary-file limit \\(JOB_TEMP_MAX_BYTES\\)\\)`));
    expect(await readdir(root)).toEqual([]);
  });

  it('when the gzip holds no readable HDF5, then inspection fails on the file and the folder is empty', async () => {
    const broken = gzipSync(Buffer.concat([Buffer.from([0x89, 0x48, 0x44, 0x46, 0x0d, 0x0a, 0x1a, 0x0a]), Buffer.alloc(20_000, 3)]));
    const row = await inspected('broken.h5.gz', broken);
    expect(row.status).toBe('failed');
    expect(row.error).toMatch(/^broken\.h5\.gz: not a readable HDF5 file/);
    expect(await readdir(root)).toEqual([]);
  });

  it('when a running analysis is cancelled, then its job folder, there while it ran, is gone', async () => {
    const row = await inspected('crystal.extxyz', await jitteredCrystalExtxyz());
    expect(row.status).toBe('ready');
    const run = await startRun(testApp.ctx, row.id, userId, ['rdf'], {});
    const runRow = async () => (await testApp.ctx.db.select().from(analysisRuns).where(eq(analysisRuns.id, run.id)))[0]!;
    await pollUntil(runRow, (r) => r.status === 'running' && r.progress >= 30, 60_000, 100);
    expect((await readdir(root)).filter((n) => n.startsWith('ergodic-job-'))).toHaveLength(1);
    await cancelRun(testApp.ctx, run.id);
    expect(await pollUntil(() => jobState(queueJobId(run.id)), (s) => s === 'completed' || s === 'failed', 60_000)).toBe('completed');
    expect((await runRow()).status).toBe('cancelled');
    expect(await readdir(root)).toEqual([]);
  }, 120_000);
});
