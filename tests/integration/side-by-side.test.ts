import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { freePort } from '../../scripts/services/wait-for-port.ts';
import { ApiClient } from '../support/api-client.ts';
import { pollUntil } from '../support/poll.ts';

interface Instance {
  name: string;
  url: string;
  dataDir: string;
  process: ChildProcess;
  output: () => string;
}

/** `npm start` as a user runs it, on ports and in a data folder of its own (without the demo lab, to save time). */
async function startInstance(name: string): Promise<Instance> {
  const dataDir = mkdtempSync(join(tmpdir(), `ergodic-${name}-`));
  const [web, db, redis, s3, smtp] = await Promise.all(Array.from({ length: 5 }, () => freePort()));
  let output = '';
  const child = spawn(process.execPath, ['--import', 'tsx', 'scripts/start.ts'], {
    env: {
      ...process.env, PORT: String(web), ERGODIC_DB_PORT: String(db), ERGODIC_REDIS_PORT: String(redis),
      ERGODIC_S3_PORT: String(s3), ERGODIC_SMTP_PORT: String(smtp), ERGODIC_DATA_DIR: dataDir,
      ERGODIC_BUILD_APP: 'false', ERGODIC_DEMO: 'false', LOG_LEVEL: 'warn',
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  child.stdout!.on('data', (chunk: Buffer) => (output += chunk.toString()));
  child.stderr!.on('data', (chunk: Buffer) => (output += chunk.toString()));
  return { name, url: `http://127.0.0.1:${web}`, dataDir, process: child, output: () => output };
}

async function stopInstance(instance: Instance): Promise<void> {
  if (instance.process.exitCode === null) {
    const exited = new Promise((resolve) => instance.process.once('exit', resolve));
    instance.process.kill('SIGTERM');
    await exited;
  }
  rmSync(instance.dataDir, { recursive: true, force: true });
}

/** Both answer shapes: a bare value or one wrapped under its name. */
function unwrap<T>(body: unknown, key: string): T {
  return (body !== null && typeof body === 'object' && key in body ? (body as Record<string, unknown>)[key] : body) as T;
}

interface TrajectoryBrief { id: number; name: string; status: string; error: string | null }
interface RunBrief { id: number; status: string; error: string | null }

/** A user of this instance uploads a small file and analyses it once it is inspected. */
async function uploadAndAnalyse(instance: Instance, fileName: string): Promise<{ trajectory: TrajectoryBrief; run: RunBrief; visible: string[] }> {
  const client = await new ApiClient(instance.url).prime();
  const registered = await client.post('/api/auth/register', { email: `${instance.name}@larkspur-lab.example`, password: 'side-by-side-2026', displayName: instance.name });
  expect(registered.status, registered.text).toBe(201);
  const project = unwrap<{ id: number }>((await client.post('/api/projects', { name: `${instance.name} runs` })).body, 'project');
  const frames = Array.from({ length: 20 }, (_, f) => `2\nTime=${(f * 0.5).toFixed(1)}\nAr ${(0.01 * f).toFixed(2)} 0 0\nAr 3 ${(0.01 * f).toFixed(2)} 0\n`).join('');
  const upload = await client.raw('post', `/api/projects/${project.id}/trajectories`).attach('file', Buffer.from(frames), fileName);
  expect(upload.status, upload.text).toBe(201);
  const id = unwrap<TrajectoryBrief>(upload.body, 'trajectory').id;
  const trajectory = await pollUntil(async () => unwrap<TrajectoryBrief>((await client.get(`/api/trajectories/${id}`)).body, 'trajectory'),
    (t) => t.status !== 'inspecting', 120_000, 250);
  expect([trajectory.status, trajectory.error], instance.output()).toEqual(['ready', null]);
  const started = await client.post(`/api/trajectories/${id}/analyses`, { analyses: ['msd'], params: {} });
  expect(started.status, started.text).toBe(202);
  const runId = unwrap<RunBrief>(started.body, 'job').id;
  const run = await pollUntil(async () => unwrap<RunBrief>((await client.get(`/api/jobs/${runId}`)).body, 'job'),
    (r) => r.status === 'done' || r.status === 'failed', 120_000, 250);
  const visible = unwrap<TrajectoryBrief[]>((await client.get(`/api/projects/${project.id}/trajectories`)).body, 'trajectories').map((t) => t.name);
  return { trajectory, run, visible };
}

const instances: Instance[] = [];

beforeAll(async () => {
  instances.push(await startInstance('left'), await startInstance('right'));
  for (const instance of instances) {
    const output = await pollUntil(async () => instance.output(), (o) => o.includes('Ergodic is running at') || instance.process.exitCode !== null, 240_000, 250);
    expect(output, `${instance.name} did not start`).toContain('Ergodic is running at');
  }
}, 300_000);

afterAll(async () => {
  await Promise.all(instances.map(stopInstance));
}, 120_000);

describe('two npm start instances side by side', () => {
  it('when each has its own ports and data folder, then each one inspects and analyses its own uploads with its own services', async () => {
    const [left, right] = instances as [Instance, Instance];
    const [l, r] = await Promise.all([uploadAndAnalyse(left, 'left-run.xyz'), uploadAndAnalyse(right, 'right-run.xyz')]);
    expect([l.run.status, l.run.error]).toEqual(['done', null]);
    expect([r.run.status, r.run.error]).toEqual(['done', null]);
    expect(l.visible).toEqual(['left-run.xyz']);
    expect(r.visible).toEqual(['right-run.xyz']);
  }, 300_000);
});
