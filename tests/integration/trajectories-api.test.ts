import { ListObjectsV2Command } from '@aws-sdk/client-s3';
import { request as httpRequest } from 'node:http';
import type { AddressInfo } from 'node:net';
import { gzipSync } from 'node:zlib';
import supertest from 'supertest';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { projectMembers, trajectories } from '../../server/db/schema/index.ts';
import { startWorker, type RunningWorker } from '../../server/jobs/worker.ts';
import { dropStaleUploads } from '../../server/services/trajectories.ts';
import { decodeFramesPayload } from '../../src/app/viewer/frames-payload-decoder.ts';
import { ApiClient } from '../support/api-client.ts';
import { signUp, type TestAccount } from '../support/accounts.ts';
import { lennardJonesExtxyz } from '../support/fixtures.ts';
import { pollUntil } from '../support/poll.ts';
import { createTestApp } from '../support/test-app.ts';

const testApp = createTestApp({ UPLOAD_MAX_BYTES: String(4 * 1024 * 1024) });
const { app, ctx } = testApp;
let worker: RunningWorker;
let owner: TestAccount;
let script: ApiClient;
let projectId: number;
let liquid: Awaited<ReturnType<typeof lennardJonesExtxyz>>;

async function objectKeysUnder(prefix: string): Promise<string[]> {
  const out = await ctx.store.client.send(new ListObjectsV2Command({ Bucket: ctx.store.bucket, Prefix: prefix }));
  return (out.Contents ?? []).map((o) => o.Key!);
}

async function waitUntilSettled(id: number) {
  const res = await pollUntil(() => script.get(`/api/trajectories/${id}`), (r) => !['uploading', 'inspecting'].includes(r.body.trajectory.status));
  return res.body.trajectory;
}

function upload(client: ApiClient | null, bytes: Buffer, name: string, fields: Record<string, string> = {}) {
  const request = (client ?? script).raw('post', `/api/projects/${projectId}/trajectories`);
  for (const [k, v] of Object.entries(fields)) request.field(k, v);
  return request.attach('file', bytes, name);
}

beforeAll(async () => {
  worker = await startWorker(testApp.config, ctx.log);
  owner = await signUp(app, 'uploader');
  const created = await owner.client.post('/api/projects', { name: 'Ingest tests' });
  projectId = created.body.project.id;
  const token = await owner.client.post('/api/tokens', { name: 'cluster' });
  script = ApiClient.withToken(app, token.body.token.token);
  liquid = await lennardJonesExtxyz({ productionSteps: 600 });
});
afterAll(async () => {
  await worker.close();
  await testApp.close();
});

describe('POST /api/projects/:id/trajectories (upload)', () => {
  it('when a script uploads a gzip-compressed extended XYZ with a bearer token, then it is stored, checksummed and inspected to ready', async () => {
    const gz = gzipSync(liquid.bytes);
    const res = await upload(null, gz, 'run.extxyz.gz', { temperatureK: '86.5', ensemble: 'NVE', potential: 'LJ 12-6' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.trajectory.sizeBytes).toBe(gz.length);
    expect(res.body.trajectory.sha256).toMatch(/^[0-9a-f]{64}$/);
    const ready = await waitUntilSettled(res.body.trajectory.id);
    expect(ready.error).toBeNull();
    expect(ready).toMatchObject({
      status: 'ready', format: 'extxyz', compression: 'gzip', atoms: liquid.run.trajectory.nAtoms,
      frames: liquid.run.trajectory.nFrames, hasVelocities: true, temperatureK: 86.5, ensemble: 'NVE', potential: 'LJ 12-6',
    });
    expect(ready.fromFile).toContain('timeStep');
  });

  it('when a metadata field is wrong, then the upload is refused naming the field, and no object is left behind', async () => {
    const before = await objectKeysUnder(`projects/${projectId}/`);
    const res = await upload(null, liquid.bytes, 'bad-meta.extxyz', { ensemble: 'NXT' });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/ensemble/);
    expect(await objectKeysUnder(`projects/${projectId}/`)).toEqual(before);
  });

  it('when the file is larger than the upload limit, then it answers 413 with the limit and keeps no object or row', async () => {
    const before = await objectKeysUnder(`projects/${projectId}/`);
    const rowsBefore = await ctx.db.select().from(trajectories).where(eq(trajectories.projectId, projectId));
    const res = await upload(null, Buffer.alloc(5 * 1024 * 1024, 65), 'huge.xyz');
    expect(res.status).toBe(413);
    expect(res.body.error.message).toMatch(/^The file is larger than the upload limit of 4\.0 MiB\. Compress it with gzip or zip/);
    await new Promise((r) => setTimeout(r, 300));
    expect(await objectKeysUnder(`projects/${projectId}/`)).toEqual(before);
    expect(await ctx.db.select().from(trajectories).where(eq(trajectories.projectId, projectId))).toHaveLength(rowsBefore.length);
  });

  it('when a request declares a body too long to hold a file within the limit, then 413 comes back before the body is sent, naming the limit and what to do', async () => {
    const server = app.listen(0, '127.0.0.1');
    await new Promise((r) => server.once('listening', r));
    const port = (server.address() as AddressInfo).port;
    // What the browser reads to refuse such a file before sending it.
    expect((await owner.client.get('/api/upload-policy')).body.uploadPolicy).toEqual({ fileMaxBytes: 4 * 1024 * 1024, decompressedMaxBytes: ctx.config.DECOMPRESSED_MAX_BYTES, decompressionMaxRatio: ctx.config.DECOMPRESSION_MAX_RATIO });
    const token = (await owner.client.post('/api/tokens', { name: 'big-file' })).body.token.token as string;
    const rowsBefore = await ctx.db.select().from(trajectories).where(eq(trajectories.projectId, projectId));
    try {
      // 3 GiB declared, a few bytes sent: the answer can only come from the declared length.
      const answer = await new Promise<{ status: number; body: string }>((resolve, reject) => {
        const boundary = 'ergodic-test-boundary';
        const req = httpRequest({
          host: '127.0.0.1', port, method: 'POST', path: `/api/projects/${projectId}/trajectories`,
          headers: { authorization: `Bearer ${token}`, 'content-type': `multipart/form-data; boundary=${boundary}`, 'content-length': String(3 * 1024 ** 3) },
        }, (res) => {
          const chunks: Buffer[] = [];
          res.on('data', (c: Buffer) => chunks.push(c));
          res.on('end', () => {
            req.destroy();
            resolve({ status: res.statusCode!, body: Buffer.concat(chunks).toString('utf8') });
          });
        });
        req.on('error', reject);
        req.write(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="run-3gb.extxyz"\r\nContent-Type: text/plain\r\n\r\n`);
      });
      expect(answer.status).toBe(413);
      const message = JSON.parse(answer.body).error.message as string;
      expect(message).toBe('The upload is 3.0 GiB, larger than the upload limit of 4.0 MiB. Compress it with gzip or zip (text trajectories shrink several-fold, and are read compressed), or ask the site administrator to raise UPLOAD_MAX_BYTES.');
      expect(await ctx.db.select().from(trajectories).where(eq(trajectories.projectId, projectId))).toHaveLength(rowsBefore.length);
    } finally {
      server.close();
    }
  });

  it('when the connection drops mid-upload, then the row seen as uploading meanwhile is gone, and no object remains', async () => {
    const server = app.listen(0, '127.0.0.1');
    await new Promise((r) => server.once('listening', r));
    const port = (server.address() as AddressInfo).port;
    const token = (await owner.client.post('/api/tokens', { name: 'flaky' })).body.token.token as string;
    const before = await objectKeysUnder(`projects/${projectId}/`);
    const rowsBefore = await ctx.db.select().from(trajectories).where(eq(trajectories.projectId, projectId));
    let seenUploading = false;
    await new Promise<void>((resolve) => {
      const boundary = 'ergodic-test-boundary';
      const req = httpRequest({
        host: '127.0.0.1', port, method: 'POST', path: `/api/projects/${projectId}/trajectories`,
        headers: { authorization: `Bearer ${token}`, 'content-type': `multipart/form-data; boundary=${boundary}`, 'content-length': String(3 * 1024 * 1024) },
      });
      req.on('error', () => resolve());
      req.write(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="cut-off.xyz"\r\nContent-Type: text/plain\r\n\r\n`);
      req.write(Buffer.alloc(1024 * 1024, 65), () => setTimeout(async () => {
        const rows = await ctx.db.select().from(trajectories).where(eq(trajectories.projectId, projectId));
        seenUploading = rows.some((r) => r.name === 'cut-off.xyz' && r.status === 'uploading');
        req.destroy();
        resolve();
      }, 300));
    });
    await new Promise((r) => setTimeout(r, 1500));
    server.close();
    expect(seenUploading).toBe(true);
    expect(await ctx.db.select().from(trajectories).where(eq(trajectories.projectId, projectId))).toHaveLength(rowsBefore.length);
    expect(await objectKeysUnder(`projects/${projectId}/`)).toEqual(before);
  });

  it('when an upload was left half-done hours ago by a process that went away, then it is dropped, and a recent one is kept', async () => {
    const [old] = await ctx.db.insert(trajectories).values({
      projectId, uploadedBy: owner.id, name: 'abandoned.xyz', objectKey: 'projects/x/abandoned', status: 'uploading', createdAt: new Date(Date.now() - 7 * 3600_000),
    }).$returningId();
    const [recent] = await ctx.db.insert(trajectories).values({
      projectId, uploadedBy: owner.id, name: 'in-flight.xyz', objectKey: 'projects/x/in-flight', status: 'uploading',
    }).$returningId();
    await dropStaleUploads(ctx);
    expect(await ctx.db.select().from(trajectories).where(eq(trajectories.id, old.id))).toHaveLength(0);
    expect(await ctx.db.select().from(trajectories).where(eq(trajectories.id, recent.id))).toHaveLength(1);
    await ctx.db.delete(trajectories).where(eq(trajectories.id, recent.id));
  });

  it('when a file states no times, then analyses are refused until the time between frames is given, and then accepted', async () => {
    const res = await upload(null, Buffer.from('2\nno times here\nAr 0 0 0\nAr 1 1 1\n2\n\nAr 0.1 0 0\nAr 1 1.1 1\n2\n\nAr 0.2 0 0\nAr 1 1.2 1\n'), 'untimed.xyz');
    const ready = await waitUntilSettled(res.body.trajectory.id);
    expect(ready.status).toBe('ready');
    expect(ready.timeStep).toBeNull();
    const refused = await script.post(`/api/trajectories/${ready.id}/analyses`, { analyses: ['msd'] });
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toMatch(/untimed\.xyz states no time between frames/);
    await script.patch(`/api/trajectories/${ready.id}`, { timeStep: 2, timeUnit: 'fs' });
    const accepted = await script.post(`/api/trajectories/${ready.id}/analyses`, { analyses: ['msd'] });
    expect(accepted.status).toBe(202);
    expect(['queued', 'running']).toContain(accepted.body.job.status);
  });

  it('when there is no file part, then it says to send the trajectory in a field named "file"', async () => {
    const res = await script.raw('post', `/api/projects/${projectId}/trajectories`).field('name', 'x');
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/field named "file"/);
  });

  it('when the file is malformed, then that trajectory fails with file, frame and line, and the project keeps its other trajectories', async () => {
    const res = await upload(null, Buffer.from('3\nframe one\nAr 0 0 0\nAr 1 1 1\nAr 2 2 2\n3\nframe two\nAr 0 0 0\nAr 1 1 1\n'), 'short.xyz');
    expect(res.status).toBe(201);
    const failed = await waitUntilSettled(res.body.trajectory.id);
    expect(failed.status).toBe('failed');
    expect(failed.error).toMatch(/short\.xyz.*frame 2/);
    const list = await script.get(`/api/projects/${projectId}/trajectories`);
    expect(list.body.trajectories.filter((t: { status: string }) => t.status === 'ready').length).toBeGreaterThan(0);
  });
});

describe('trajectory metadata, frames and cuts', () => {
  let id: number;
  beforeAll(async () => {
    const res = await upload(null, liquid.bytes, 'liquid.extxyz');
    id = (await waitUntilSettled(res.body.trajectory.id)).id;
  });

  it('when the uploader corrects the time step, then it is stored and no longer marked as read from the file', async () => {
    const res = await script.patch(`/api/trajectories/${id}`, { timeStep: 0.02, timeUnit: 'ps', notes: 'checked' });
    expect(res.status).toBe(200);
    expect(res.body.trajectory.timeStep).toBe(0.02);
    expect(res.body.trajectory.fromFile).not.toContain('timeStep');
  });

  it('when the uploader states the constraints, then they are stored; a negative or fractional count is refused by name', async () => {
    const res = await script.patch(`/api/trajectories/${id}`, { constraints: 12 });
    expect(res.status).toBe(200);
    expect(res.body.trajectory.constraints).toBe(12);
    for (const bad of [-1, 2.5]) {
      const refused = await script.patch(`/api/trajectories/${id}`, { constraints: bad });
      expect(refused.status).toBe(400);
      expect(refused.body.error.message).toMatch(/constraints/);
    }
    await script.patch(`/api/trajectories/${id}`, { constraints: null });
  });

  it('when metadata values are out of range, then every bad field is named', async () => {
    const res = await script.patch(`/api/trajectories/${id}`, { temperatureK: -5, lengthUnit: 'furlong' });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/temperatureK/);
    expect(res.body.error.message).toMatch(/lengthUnit/);
  });

  it('when the viewer asks for a late frame range, then the positions are exactly those of the file, in Å', async () => {
    const traj = liquid.run.trajectory;
    const res = await script.raw('get', `/api/trajectories/${id}/frames?from=40&to=46&stride=2`).buffer(true)
      .parse((response, done) => { const chunks: Buffer[] = []; response.on('data', (c: Buffer) => chunks.push(c)); response.on('end', () => done(null, Buffer.concat(chunks))); });
    expect(res.status).toBe(200);
    const body = res.body as Buffer;
    // The browser's own decoder reads what the server wrote.
    const decoded = decodeFramesPayload(body.buffer.slice(body.byteOffset, body.byteOffset + body.byteLength) as ArrayBuffer);
    expect(decoded.frames.map((f) => f.index)).toEqual([40, 42, 44]);
    expect(decoded.atoms).toBe(traj.nAtoms);
    const n3 = traj.nAtoms * 3;
    for (let k = 0; k < 3; k++) {
      const expected = traj.positions.subarray((40 + 2 * k) * n3, (41 + 2 * k) * n3);
      const got = decoded.frames[k]!.positions;
      // The file holds decimal text; Float32 round trip to 1e-4 Å is ample for a viewer.
      for (let i = 0; i < n3; i += 37) expect(got[i]).toBeCloseTo(expected[i]!, 3);
    }
  });

  /** The frames payload as bytes, with the response's status and headers. */
  async function framesOf(client: ApiClient, query: string, headers: Record<string, string> = {}) {
    let req = client.raw('get', `/api/trajectories/${id}/frames?${query}`);
    for (const [name, value] of Object.entries(headers)) req = req.set(name, value);
    return req.buffer(true).parse((response, done) => {
      const chunks: Buffer[] = [];
      response.on('data', (c: Buffer) => chunks.push(c));
      response.on('end', () => done(null, Buffer.concat(chunks)));
    });
  }

  it('when the viewer asks again for frames it holds, then an ETag names them, a revalidation gets 304 without a body, and another range or unit has another ETag', async () => {
    const first = await framesOf(script, 'from=3&to=5');
    expect(first.status).toBe(200);
    const etag = first.headers['etag'] as string;
    expect(etag).toMatch(/^"[A-Za-z0-9_-]+"$/);
    expect(first.headers['cache-control']).toBe('private, max-age=3600');
    // Asked again (now from the server's cache), the same bytes under the same name.
    const again = await framesOf(script, 'from=3&to=5');
    expect(again.headers['etag']).toBe(etag);
    expect(Buffer.compare(again.body as Buffer, first.body as Buffer)).toBe(0);
    const revalidated = await framesOf(script, 'from=3&to=5', { 'If-None-Match': etag });
    expect(revalidated.status).toBe(304);
    expect((revalidated.body as Buffer).length).toBe(0);
    expect((await framesOf(script, 'from=4&to=6')).headers['etag']).not.toBe(etag);
    // Stated in nm instead, the same stored numbers are ten times as many Å: a new ETag and new positions.
    const unit = (await script.get(`/api/trajectories/${id}`)).body.trajectory.lengthUnit as string;
    expect(unit).toBe('angstrom');
    expect((await script.patch(`/api/trajectories/${id}`, { lengthUnit: 'nm' })).status).toBe(200);
    try {
      const inNm = await framesOf(script, 'from=3&to=5', { 'If-None-Match': etag });
      expect(inNm.status).toBe(200);
      expect(inNm.headers['etag']).not.toBe(etag);
      const positions = (res: { body: unknown }) => {
        const body = res.body as Buffer;
        return decodeFramesPayload(body.buffer.slice(body.byteOffset, body.byteOffset + body.byteLength) as ArrayBuffer).frames[0]!.positions;
      };
      const before = positions(first);
      const after = positions(inNm);
      for (let i = 0; i < before.length; i += 29) expect(after[i]).toBeCloseTo(before[i]! * 10, 3);
    } finally {
      await script.patch(`/api/trajectories/${id}`, { lengthUnit: unit });
    }
  });

  it('when a member is removed or signs out, then their next frames request is refused at once, right after one that was served', async () => {
    const member = await signUp(app, 'watcher');
    await ctx.db.insert(projectMembers).values({ projectId, userId: member.id, role: 'viewer' });
    expect((await framesOf(member.client, 'from=0&to=1')).status).toBe(200);
    expect((await owner.client.delete(`/api/projects/${projectId}/members/${member.id}`)).status).toBe(204);
    expect((await framesOf(member.client, 'from=0&to=1')).status).toBe(404);

    const leaving = await signUp(app, 'leaver');
    await ctx.db.insert(projectMembers).values({ projectId, userId: leaving.id, role: 'viewer' });
    const served = await framesOf(leaving.client, 'from=0&to=1');
    expect(served.status).toBe(200);
    const sessionCookie = ([] as string[]).concat(served.headers['set-cookie'] ?? []).find((c) => c.startsWith('ergodic.sid='))!.split(';')[0]!;
    expect((await leaving.client.post('/api/auth/logout')).status).toBe(204);
    // The cookie of the ended session, sent again as a stale tab would.
    expect((await supertest(app).get(`/api/trajectories/${id}/frames?from=0&to=1`).set('Cookie', sessionCookie)).status).toBe(401);
  });

  it('when a range starts past the last frame, then it says how many frames there are', async () => {
    const res = await script.get(`/api/trajectories/${id}/frames?from=100000`);
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/has \d+ frames/);
  });

  it('when a cut is downloaded, then it is extended XYZ with exactly the asked frames', async () => {
    const res = await script.raw('get', `/api/trajectories/${id}/cut?from=3&to=6`).buffer(true);
    expect(res.status).toBe(200);
    // Named with the frame numbers the interface shows, from 1: frames 3, 4, 5 counted from 0 are 4–6.
    expect(res.headers['content-disposition']).toMatch(/liquid-frames-4-6\.extxyz/);
    const text = res.text;
    const headers = text.split('\n').filter((l: string) => l.includes('Lattice='));
    expect(headers).toHaveLength(3);
    expect(headers[0]).toMatch(/Properties=species:S:1:pos:R:3/);
  });

  it('when the trajectory is deleted, then its row and stored objects are gone', async () => {
    const row = (await ctx.db.select().from(trajectories).where(eq(trajectories.id, id)))[0]!;
    const res = await script.send('delete', `/api/trajectories/${id}`);
    expect(res.status).toBe(204);
    expect(await ctx.db.select().from(trajectories).where(eq(trajectories.id, id))).toHaveLength(0);
    expect(await objectKeysUnder(row.objectKey)).toEqual([]);
  });
});
