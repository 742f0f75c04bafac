import { mkdtemp, readFile, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { trajectories } from '../../server/db/schema/index.ts';
import { openFrameStore } from '../../server/frame-store/reader.ts';
import { startWorker, type RunningWorker } from '../../server/jobs/worker.ts';
import { localCopies } from '../../server/services/local-copies.ts';
import { frameStorePrefixFor } from '../../server/storage/object-keys.ts';
import { makeSystem, writeH5md } from '../unit/formats/synthetic.ts';
import { signUp, type TestAccount } from '../support/accounts.ts';
import { lennardJonesExtxyz } from '../support/fixtures.ts';
import { pollUntil } from '../support/poll.ts';
import { createTestApp } from '../support/test-app.ts';

// Small chunks, so every file here spans many of them.
const testApp = createTestApp({ FRAME_STORE_CHUNK_BYTES: '8192' });
const { app, ctx } = testApp;
let worker: RunningWorker;
let owner: TestAccount;
let projectId: number;
let liquid: Awaited<ReturnType<typeof lennardJonesExtxyz>>;

const rowOf = async (id: number) => (await ctx.db.select().from(trajectories).where(eq(trajectories.id, id)))[0]!;

async function uploadReady(bytes: Buffer, name: string): Promise<number> {
  const res = await owner.client.raw('post', `/api/projects/${projectId}/trajectories`).attach('file', bytes, name);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  const ready = await pollUntil(() => owner.client.get(`/api/trajectories/${res.body.trajectory.id}`), (r) => r.body.trajectory.status !== 'inspecting');
  expect(ready.body.trajectory.status, JSON.stringify(ready.body)).toBe('ready');
  return res.body.trajectory.id as number;
}

async function analyse(trajectoryId: number, analyses: string[]) {
  const started = await owner.client.post(`/api/trajectories/${trajectoryId}/analyses`, { analyses });
  expect(started.status, JSON.stringify(started.body)).toBe(202);
  return (await pollUntil(() => owner.client.get(`/api/jobs/${started.body.job.id}`), (r) => ['done', 'failed'].includes(r.body.job.status), 120_000)).body.job;
}

/** A chunk of frames as the viewer gets it: the frame numbers and the positions, in Å. */
async function viewerFrames(id: number, query: string): Promise<{ status: number; indices: number[]; positions: Float32Array }> {
  const res = await owner.client.raw('get', `/api/trajectories/${id}/frames?${query}`).buffer(true).parse((r, done) => {
    const chunks: Buffer[] = [];
    r.on('data', (c: Buffer) => chunks.push(c));
    r.on('end', () => done(null, Buffer.concat(chunks)));
  });
  if (res.status !== 200) return { status: res.status, indices: [], positions: new Float32Array() };
  const body = res.body as Buffer;
  const headerLength = body.readUInt32LE(0);
  const header = JSON.parse(body.subarray(4, 4 + headerLength).toString('utf8'));
  const positions = new Float32Array(body.buffer.slice(body.byteOffset + 4 + headerLength, body.byteOffset + body.length));
  return { status: res.status, indices: header.frames.map((f: { index: number }) => f.index), positions };
}

beforeAll(async () => {
  worker = await startWorker(testApp.config, ctx.log);
  owner = await signUp(app, 'frame-store');
  projectId = (await owner.client.post('/api/projects', { name: 'Frame store' })).body.project.id;
  liquid = await lennardJonesExtxyz({ productionSteps: 400 });
});
afterAll(async () => {
  await worker.close();
  await testApp.close();
});

describe('the binary frame store written at inspection', () => {
  it('when a file is inspected, then its frames are stored in binary beside it, with the same numbers, counted in the project\'s storage', async () => {
    const id = await uploadReady(liquid.bytes, 'liquid.extxyz');
    const row = await rowOf(id);
    expect(row.frameStoreKey).toBe(`${frameStorePrefixFor(row.objectKey)}index.json`);
    const keys = await ctx.store.listKeys(frameStorePrefixFor(row.objectKey));
    expect(keys).toContain(row.frameStoreKey);
    let stored = 0;
    for (const key of keys) stored += (await ctx.store.getBytes(key)).length;
    expect(row.frameStoreBytes).toBe(stored);

    const store = await openFrameStore(ctx.store, row.frameStoreKey!);
    expect(store.index.chunks.length).toBeGreaterThan(3);
    const t = liquid.run.trajectory;
    expect(store.index).toMatchObject({ atoms: t.nAtoms, frames: t.nFrames, hasVelocities: true, timed: true, hasCell: true });
    let k = 0;
    for await (const frame of store.frames()) {
      expect(frame.index).toBe(k);
      // The extended XYZ text rounds to its printed digits; the store keeps what the text said, as Float32.
      expect(frame.positions[5]).toBeCloseTo(t.positions[k * t.nAtoms * 3 + 5]!, 4);
      expect(frame.velocities![7]).toBeCloseTo(t.velocities![k * t.nAtoms * 3 + 7]!, 4);
      k++;
    }
    expect(k).toBe(t.nFrames);

    const project = (await owner.client.get(`/api/projects/${projectId}`)).body.project;
    expect(project.storageBytes).toBeGreaterThanOrEqual(row.sizeBytes + row.frameStoreBytes);
    const dto = (await owner.client.get(`/api/trajectories/${id}`)).body.trajectory;
    expect(dto.frameStoreBytes).toBe(stored);
  });

  it('when the uploaded text is gone, then analyses, frames and cuts still work from the binary store alone', async () => {
    const id = await uploadReady(liquid.bytes, 'store-only.extxyz');
    const row = await rowOf(id);
    await ctx.store.delete(row.objectKey);
    const job = await analyse(id, ['thermo', 'msd', 'rdf']);
    expect([job.status, job.error]).toEqual(['done', null]);
    const frames = await owner.client.raw('get', `/api/trajectories/${id}/frames?from=2&to=9&stride=3`).buffer(true).parse((res, done) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => done(null, Buffer.concat(chunks)));
    });
    expect(frames.status).toBe(200);
    const body = frames.body as Buffer;
    const headerLength = body.readUInt32LE(0);
    const header = JSON.parse(body.subarray(4, 4 + headerLength).toString('utf8'));
    expect(header.frames.map((f: { index: number }) => f.index)).toEqual([2, 5, 8]);
    const positions = new Float32Array(body.buffer.slice(body.byteOffset + 4 + headerLength, body.byteOffset + body.length));
    const t = liquid.run.trajectory;
    expect(positions[3 * t.nAtoms * 3 + 1]).toBeUndefined();
    expect(positions[t.nAtoms * 3 + 1]).toBeCloseTo(t.positions[5 * t.nAtoms * 3 + 1]!, 4);
    const cut = await owner.client.get(`/api/trajectories/${id}/cut?from=0&to=2`);
    expect(cut.status).toBe(200);
    expect(cut.text.split('\n')[0]).toBe(String(t.nAtoms));
  });

  it('when a file fails inspection, then no part of a frame store is left behind', async () => {
    const good = liquid.bytes.toString('utf8').split('\n');
    const broken = Buffer.from([...good.slice(0, good.length - 20), 'Ar 1.0 x 2.0', ...good.slice(good.length - 19)].join('\n'));
    const res = await owner.client.raw('post', `/api/projects/${projectId}/trajectories`).attach('file', broken, 'broken.extxyz');
    expect(res.status).toBe(201);
    const failed = await pollUntil(() => rowOf(res.body.trajectory.id), (r) => r.status !== 'inspecting');
    expect(failed.status).toBe('failed');
    expect(failed.frameStoreKey).toBeNull();
    // Chunks of the 40 good frames were stored before the bad line was reached, and removed again.
    expect(await ctx.store.listKeys(frameStorePrefixFor(failed.objectKey))).toEqual([]);
  });

  it('when a compressed trajectory inspected before the store existed is viewed, then it is shown from the file and its store is written once in the background for later views', async () => {
    const id = await uploadReady(gzipSync(liquid.bytes), 'older.extxyz.gz');
    // As an upload from before the store: no store objects and no key.
    const inspected = await rowOf(id);
    await ctx.store.deletePrefix(frameStorePrefixFor(inspected.objectKey));
    await ctx.db.update(trajectories).set({ frameStoreKey: null, frameStoreBytes: 0 }).where(eq(trajectories.id, id));

    const t = liquid.run.trajectory;
    const perFrame = t.nAtoms * 3;
    const expectFrames = (got: Awaited<ReturnType<typeof viewerFrames>>, indices: number[]) => {
      expect([got.status, got.indices]).toEqual([200, indices]);
      indices.forEach((frame, k) => expect(got.positions[k * perFrame + 4]).toBeCloseTo(t.positions[frame * perFrame + 4]!, 4));
    };
    expectFrames(await viewerFrames(id, 'from=2&to=9&stride=3'), [2, 5, 8]);

    const stored = await pollUntil(() => rowOf(id), (r) => r.frameStoreKey !== null, 60_000);
    expect(stored.frameStoreKey).toBe(`${frameStorePrefixFor(stored.objectKey)}index.json`);
    let bytes = 0;
    for (const key of await ctx.store.listKeys(frameStorePrefixFor(stored.objectKey))) bytes += (await ctx.store.getBytes(key)).length;
    expect(stored.frameStoreBytes).toBe(bytes);
    expect((await openFrameStore(ctx.store, stored.frameStoreKey!)).index.frames).toBe(t.nFrames);
    expect([stored.status, stored.frames]).toEqual(['ready', inspected.frames]);

    // With the upload itself gone, only the new store can answer.
    await ctx.store.delete(stored.objectKey);
    expectFrames(await viewerFrames(id, 'from=30&to=32'), [30, 31]);
  });

  it('when a trajectory inspected before the store existed is analysed, then its store is written after that run, and a re-run reads the store without the text', async () => {
    const id = await uploadReady(liquid.bytes, 'older-analysed.extxyz');
    const inspected = await rowOf(id);
    await ctx.store.deletePrefix(frameStorePrefixFor(inspected.objectKey));
    await ctx.db.update(trajectories).set({ frameStoreKey: null, frameStoreBytes: 0 }).where(eq(trajectories.id, id));

    const first = await analyse(id, ['thermo', 'msd']);
    expect([first.status, first.error]).toEqual(['done', null]);
    const stored = await pollUntil(() => rowOf(id), (r) => r.frameStoreKey !== null, 60_000);
    expect((await openFrameStore(ctx.store, stored.frameStoreKey!)).index.frames).toBe(liquid.run.trajectory.nFrames);

    // The text is gone: a re-run that parsed it again would fail.
    await ctx.store.delete(stored.objectKey);
    const again = await analyse(id, ['thermo', 'msd']);
    expect([again.status, again.error]).toEqual(['done', null]);
    const reports = await Promise.all([first, again].map(async (job) => (await owner.client.get(`/api/reports/${job.reportId}`)).body.report));
    expect(reports[1].summary).toEqual(reports[0].summary);
  });

  it('when an H5MD inspected before the store existed is viewed and then deleted, then it was read from a local copy that goes with it', async () => {
    const dir = await mkdtemp(join(tmpdir(), 'ergodic-h5md-older-'));
    const system = makeSystem(5, 12, 21);
    await writeH5md(join(dir, 'older.h5'), system);
    const id = await uploadReady(gzipSync(await readFile(join(dir, 'older.h5'))), 'older.h5.gz');
    await rm(dir, { recursive: true, force: true });
    const inspected = await rowOf(id);
    await ctx.store.deletePrefix(frameStorePrefixFor(inspected.objectKey));
    await ctx.db.update(trajectories).set({ frameStoreKey: null, frameStoreBytes: 0 }).where(eq(trajectories.id, id));

    const got = await viewerFrames(id, 'from=7&to=9');
    expect([got.status, got.indices]).toEqual([200, [7, 8]]);
    expect(Array.from(got.positions.subarray(0, 3))).toEqual(Array.from(Float32Array.from(system.positions[7]!.subarray(0, 3))));
    const copies = localCopies(testApp.config);
    expect(await copies.has(inspected.objectKey)).toBe(true);
    // The background store is written from the same local copy; it is done before the deletion.
    expect((await pollUntil(() => rowOf(id), (r) => r.frameStoreKey !== null, 60_000)).frameStoreKey).not.toBeNull();
    expect((await owner.client.delete(`/api/trajectories/${id}`)).status).toBe(204);
    expect(await copies.has(inspected.objectKey)).toBe(false);
  });

  it('when a trajectory is deleted, then its frame store goes with it', async () => {
    const id = await uploadReady(liquid.bytes, 'doomed.extxyz');
    const row = await rowOf(id);
    expect((await ctx.store.listKeys(frameStorePrefixFor(row.objectKey))).length).toBeGreaterThan(0);
    expect((await owner.client.delete(`/api/trajectories/${id}`)).status).toBe(204);
    expect(await ctx.store.listKeys(frameStorePrefixFor(row.objectKey))).toEqual([]);
  });
});
