import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { reports, trajectories } from '../../server/db/schema/index.ts';
import { startWorker, type RunningWorker } from '../../server/jobs/worker.ts';
import { projectPrefix, trajectoryPrefix } from '../../server/storage/object-keys.ts';
import { signUp, type TestAccount } from '../support/accounts.ts';
import { lennardJonesExtxyz } from '../support/fixtures.ts';
import { pollUntil } from '../support/poll.ts';
import { jitteredCrystalExtxyz } from '../support/slow-trajectory.ts';
import { createTestApp } from '../support/test-app.ts';

const testApp = createTestApp();
const { app, ctx } = testApp;
let worker: RunningWorker;
let owner: TestAccount;
let liquid: Buffer;

const keysUnder = (prefix: string) => ctx.store.listKeys(prefix);

async function newProject(name: string): Promise<number> {
  return (await owner.client.post('/api/projects', { name })).body.project.id;
}

async function uploadReady(projectId: number, bytes: Buffer, name: string) {
  const res = await owner.client.raw('post', `/api/projects/${projectId}/trajectories`).attach('file', bytes, name);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  const ready = await pollUntil(() => owner.client.get(`/api/trajectories/${res.body.trajectory.id}`), (r) => r.body.trajectory.status !== 'inspecting');
  expect(ready.body.trajectory.status).toBe('ready');
  return res.body.trajectory.id as number;
}

async function analysed(trajectoryId: number): Promise<number> {
  const started = await owner.client.post(`/api/trajectories/${trajectoryId}/analyses`, { analyses: ['msd', 'rdf'] });
  expect(started.status, JSON.stringify(started.body)).toBe(202);
  const run = await pollUntil(() => owner.client.get(`/api/jobs/${started.body.job.id}`), (r) => ['done', 'failed'].includes(r.body.job.status), 120_000);
  expect(run.body.job.status, JSON.stringify(run.body)).toBe('done');
  return run.body.job.reportId as number;
}

beforeAll(async () => {
  worker = await startWorker(testApp.config, ctx.log);
  owner = await signUp(app, 'lifecycle');
  liquid = (await lennardJonesExtxyz({ productionSteps: 400 })).bytes;
});
afterAll(async () => {
  await worker.close();
  await testApp.close();
});

describe('every stored object belongs to what owns it', () => {
  it('when a trajectory has been inspected and analysed, then all its objects sit in its folder inside the project folder', async () => {
    const projectId = await newProject('Layout');
    const id = await uploadReady(projectId, liquid, 'layout.extxyz');
    const reportId = await analysed(id);
    const [row] = await ctx.db.select().from(trajectories).where(eq(trajectories.id, id));
    const [report] = await ctx.db.select().from(reports).where(eq(reports.id, reportId));
    const folder = trajectoryPrefix(row!.objectKey);
    expect(folder.startsWith(projectPrefix(projectId))).toBe(true);
    const keys = await keysUnder(folder);
    expect(keys).toContain(row!.objectKey);
    expect(keys).toContain(report!.curvesKey);
    expect(keys.length).toBeGreaterThanOrEqual(3);
  });

  it('when a trajectory is deleted, then its upload, indexes and report curves are gone and its sibling keeps everything', async () => {
    const projectId = await newProject('Delete one');
    const doomed = await uploadReady(projectId, liquid, 'doomed.extxyz');
    const kept = await uploadReady(projectId, liquid, 'kept.extxyz');
    await analysed(doomed);
    await analysed(kept);
    const [keptRow] = await ctx.db.select().from(trajectories).where(eq(trajectories.id, kept));
    const keptBefore = await keysUnder(trajectoryPrefix(keptRow!.objectKey));
    const [doomedRow] = await ctx.db.select().from(trajectories).where(eq(trajectories.id, doomed));
    expect((await keysUnder(trajectoryPrefix(doomedRow!.objectKey))).length).toBeGreaterThan(1);

    const res = await owner.client.delete(`/api/trajectories/${doomed}`);
    expect(res.status).toBe(204);
    expect(await keysUnder(trajectoryPrefix(doomedRow!.objectKey))).toEqual([]);
    expect(await ctx.db.select().from(reports).where(eq(reports.trajectoryId, doomed))).toEqual([]);
    expect(await keysUnder(trajectoryPrefix(keptRow!.objectKey))).toEqual(keptBefore);
  });

  it('when a project is deleted, then nothing is left under its folder in the store', async () => {
    const projectId = await newProject('Delete all');
    const id = await uploadReady(projectId, liquid, 'all.extxyz');
    await analysed(id);
    await uploadReady(projectId, liquid, 'second.extxyz');
    expect((await keysUnder(projectPrefix(projectId))).length).toBeGreaterThanOrEqual(4);
    const res = await owner.client.delete(`/api/projects/${projectId}`, { confirm: 'Delete all' });
    expect(res.status).toBe(204);
    expect(await keysUnder(projectPrefix(projectId))).toEqual([]);
  });

  it('when a trajectory is deleted while it is being inspected, then the inspection leaves no orphan behind', async () => {
    const projectId = await newProject('Delete mid-inspection');
    const bytes = await jitteredCrystalExtxyz(5, 300);
    const res = await owner.client.raw('post', `/api/projects/${projectId}/trajectories`).attach('file', bytes, 'busy.extxyz');
    expect(res.status).toBe(201);
    const job = await pollUntil(async () => ctx.queue.queue.getJob(`inspect-${res.body.trajectory.id}`), (j) => j !== undefined);
    const state = await pollUntil(() => job!.getState(), (s) => s !== 'waiting' && s !== 'delayed' && s !== 'prioritized');
    expect(state).toBe('active');
    const [row] = await ctx.db.select().from(trajectories).where(eq(trajectories.id, res.body.trajectory.id));
    expect((await owner.client.delete(`/api/trajectories/${res.body.trajectory.id}`)).status).toBe(204);
    const finished = await pollUntil(() => job!.getState(), (s) => s === 'completed' || s === 'failed');
    expect(finished).toBe('completed');
    expect(await keysUnder(trajectoryPrefix(row!.objectKey))).toEqual([]);
    expect(await keysUnder(projectPrefix(projectId))).toEqual([]);
  });
});
