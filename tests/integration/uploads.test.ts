import { createHash } from 'node:crypto';
import { request as httpRequest, type IncomingMessage } from 'node:http';
import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { trajectories } from '../../server/db/schema/index.ts';
import { startWorker, type RunningWorker } from '../../server/jobs/worker.ts';
import { ApiClient } from '../support/api-client.ts';
import { signUp, type TestAccount } from '../support/accounts.ts';
import { pollUntil } from '../support/poll.ts';
import { createTestApp } from '../support/test-app.ts';

const testApp = createTestApp({ UPLOAD_MAX_BYTES: String(16 * 1024 * 1024) });
const { app, ctx } = testApp;
let owner: TestAccount;
let script: ApiClient;
let token: string;
let projectId: number;
let server: Server;
let port: number;

/** Deterministic bytes that are not one repeated value, so a dropped or doubled chunk changes the hash. */
function bytesOfSize(size: number): Buffer {
  const out = Buffer.alloc(size);
  let x = size * 2654435761 >>> 0;
  for (let i = 0; i < size; i++) {
    x = (x * 1103515245 + 12345) >>> 0;
    out[i] = 32 + ((x >>> 16) % 90);
  }
  return out;
}

const sha256 = (b: Buffer | Uint8Array) => createHash('sha256').update(b).digest('hex');

async function rowsOfProject() {
  return ctx.db.select().from(trajectories).where(eq(trajectories.projectId, projectId));
}

interface RawReply { status: number; body: { error?: { message: string } } & Record<string, unknown> }

/** Sends a hand-made multipart body over a real socket, in pieces, each written after the previous one drained. */
function rawUpload(pieces: (Buffer | string)[], headers: Record<string, string>): Promise<RawReply> {
  return new Promise((resolve, reject) => {
    const req = httpRequest({
      host: '127.0.0.1', port, method: 'POST', path: `/api/projects/${projectId}/trajectories`,
      headers: { authorization: `Bearer ${token}`, ...headers },
    }, (res: IncomingMessage) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, body: JSON.parse(Buffer.concat(chunks).toString('utf8') || '{}') }));
    });
    req.on('error', reject);
    const next = (i: number) => {
      if (i === pieces.length) return void req.end();
      req.write(pieces[i]!, () => setImmediate(() => next(i + 1)));
    };
    next(0);
  });
}

beforeAll(async () => {
  owner = await signUp(app, 'sizes');
  projectId = (await owner.client.post('/api/projects', { name: 'Upload sizes' })).body.project.id;
  token = (await owner.client.post('/api/tokens', { name: 'cluster' })).body.token.token;
  script = ApiClient.withToken(app, token);
  server = app.listen(0, '127.0.0.1');
  await new Promise((r) => server.once('listening', r));
  port = (server.address() as AddressInfo).port;
});
afterAll(async () => {
  for (const row of await rowsOfProject()) await script.delete(`/api/trajectories/${row.id}`);
  server.close();
  await testApp.close();
});

const KiB = 1024;
const MiB = 1024 * 1024;
// Every size that sits on or beside a buffer boundary on the way: stream high-water marks (16 and 64 KiB),
// socket reads, the 85–130 kB range once refused, and the store's 5 MiB minimum and 8 MiB part size.
const SIZES = [
  1, 2, 100, 4 * KiB - 1, 4 * KiB, 4 * KiB + 1, 16 * KiB - 1, 16 * KiB, 16 * KiB + 1, 64 * KiB - 1, 64 * KiB, 64 * KiB + 1,
  85_000, 98_304, 100_000, 110_000, 120_000, 128 * KiB - 1, 128 * KiB, 128 * KiB + 1, 130_000, 256 * KiB + 1,
  MiB - 1, MiB, MiB + 1, 5 * MiB - 1, 5 * MiB + 1, 8 * MiB - 1, 8 * MiB, 8 * MiB + 1, 12 * MiB + 3,
];

describe('uploads of every size', () => {
  it.each(SIZES)('when a %i-byte file is uploaded, then it is accepted and stored byte for byte', async (size) => {
    const bytes = bytesOfSize(size);
    const res = await script.raw('post', `/api/projects/${projectId}/trajectories`).attach('file', bytes, `size-${size}.xyz`);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.trajectory.sizeBytes).toBe(size);
    expect(res.body.trajectory.sha256).toBe(sha256(bytes));
    const [row] = await ctx.db.select().from(trajectories).where(eq(trajectories.id, res.body.trajectory.id));
    expect(row!.status).not.toBe('uploading');
    expect(sha256(await ctx.store.getBytes(row!.objectKey))).toBe(sha256(bytes));
    await script.delete(`/api/trajectories/${res.body.trajectory.id}`);
  });

  it('when a 100 kB file arrives in small pieces over a slow connection, then it is accepted whole', async () => {
    const bytes = bytesOfSize(100_000);
    const boundary = 'ergodic-slow-boundary';
    const head = `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="slow.xyz"\r\nContent-Type: text/plain\r\n\r\n`;
    const tail = `\r\n--${boundary}--\r\n`;
    const pieces: (Buffer | string)[] = [head];
    for (let at = 0; at < bytes.length; at += 3000) pieces.push(bytes.subarray(at, at + 3000));
    pieces.push(tail);
    const length = Buffer.byteLength(head) + bytes.length + Buffer.byteLength(tail);
    const reply = await rawUpload(pieces, { 'content-type': `multipart/form-data; boundary=${boundary}`, 'content-length': String(length) });
    expect(reply.status, JSON.stringify(reply.body)).toBe(201);
    expect((reply.body['trajectory'] as { sha256: string }).sha256).toBe(sha256(bytes));
  });

  it('when the file is empty, then it is refused as empty and nothing is kept', async () => {
    const before = await rowsOfProject();
    const res = await script.raw('post', `/api/projects/${projectId}/trajectories`).attach('file', Buffer.alloc(0), 'empty.xyz');
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/empty/);
    expect(await rowsOfProject()).toHaveLength(before.length);
  });
});

describe('uploads that fail leave nothing uploading', () => {
  it('when the body never sends its closing boundary, then it answers 400 and no row is left uploading', async () => {
    const boundary = 'ergodic-open-boundary';
    const head = `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="open-ended.xyz"\r\n\r\n`;
    for (const size of [10, 100_000, 2 * MiB]) {
      const reply = await rawUpload([head, bytesOfSize(size)], { 'content-type': `multipart/form-data; boundary=${boundary}` });
      expect(reply.status).toBe(400);
      expect(reply.body.error?.message).toMatch(/incomplete|interrupted/);
      const rows = await rowsOfProject();
      expect(rows.filter((r) => r.name === 'open-ended.xyz')).toEqual([]);
      expect(rows.filter((r) => r.status === 'uploading')).toEqual([]);
    }
  });

  it('when a multipart request has no boundary, then it answers 400 saying so', async () => {
    const reply = await rawUpload(['whatever'], { 'content-type': 'multipart/form-data' });
    expect(reply.status).toBe(400);
    expect(reply.body.error?.message).toMatch(/no boundary/);
  });

  it.each([
    ['a NUL byte (RFC 8187 form)', `filename*=UTF-8''run%00.xyz`, /control character \(U\+0000\)/],
    ['a line break (HTML form escape)', 'filename="run%0D%0AX-Evil: 1.xyz"', /control character \(U\+000D\)/],
    ['a right-to-left override', `filename*=UTF-8''report%E2%80%AEtxt.xyz`, /text-direction control character \(U\+202E\)/],
    ['a raw NUL byte', 'filename="run\u0000.xyz"', /malformed|control character/],
  ])('when the file name holds %s, then it answers 400 naming the problem and keeps nothing', async (_what, param, message) => {
    const before = await rowsOfProject();
    const boundary = 'ergodic-name-boundary';
    const body = Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="file"; ${param}\r\n\r\n2\n\nAr 0 0 0\nAr 1 1 1\n\r\n--${boundary}--\r\n`);
    const reply = await rawUpload([body], { 'content-type': `multipart/form-data; boundary=${boundary}`, 'content-length': String(body.length) });
    expect(reply.status).toBe(400);
    expect(reply.body.error?.message).toMatch(message);
    expect(await rowsOfProject()).toHaveLength(before.length);
  });
});

describe('file names beyond ASCII', () => {
  let worker: RunningWorker;
  beforeAll(async () => {
    worker = await startWorker(testApp.config, ctx.log);
  });
  afterAll(async () => {
    await worker.close();
  });

  it('when a file is named α-quartz_Müller.xyz, then the name is kept as sent and downloads carry it in filename*', async () => {
    const name = 'α-quartz_Müller.xyz';
    const xyz = Buffer.from('2\nTime=0.0\nSi 0 0 0\nO 1 1 1\n2\nTime=0.1\nSi 0.1 0 0\nO 1 1.1 1\n');
    const res = await script.raw('post', `/api/projects/${projectId}/trajectories`).attach('file', xyz, name);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.trajectory.name).toBe(name);
    const [row] = await ctx.db.select().from(trajectories).where(eq(trajectories.id, res.body.trajectory.id));
    expect(row!.name).toBe(name);
    expect(row!.objectKey).toMatch(/^projects\/\d+\/trajectories\/[0-9a-f-]{36}\/[\w.+-]+$/);
    const ready = await pollUntil(() => script.get(`/api/trajectories/${res.body.trajectory.id}`), (r) => r.body.trajectory.status !== 'inspecting');
    expect(ready.body.trajectory.status, JSON.stringify(ready.body)).toBe('ready');
    const cut = await script.raw('get', `/api/trajectories/${res.body.trajectory.id}/cut?from=0&to=1`).buffer(true);
    expect(cut.status).toBe(200);
    const disposition = cut.headers['content-disposition'] as string;
    expect(disposition).toContain(`filename*=UTF-8''${encodeURIComponent('α-quartz_Müller-frame-1.extxyz')}`);
    expect(disposition).toMatch(/filename="[\x20-\x7e]+"/);
  });
});
