import { randomUUID } from 'node:crypto';
import { expect, type BrowserContext } from '@playwright/test';
import type { TrajectoryDto } from '../../../shared/trajectory.ts';

async function xsrf(context: BrowserContext): Promise<Record<string, string>> {
  const token = (await context.cookies()).find((c) => c.name === 'XSRF-TOKEN')?.value;
  if (!token) throw new Error('the server set no XSRF-TOKEN cookie');
  return { 'X-XSRF-TOKEN': decodeURIComponent(token) };
}

export interface RunFile {
  name: string;
  bytes: Buffer;
  /** The temperature the run was made at, as a user states it at upload. */
  temperatureK: number;
}

/**
 * Through the API, as a script would: a new account signed in within
 * `context`, a project, and the runs uploaded with their stated temperature
 * and inspected to ready. Returns the project's id.
 */
export async function projectWithRuns(context: BrowserContext, runs: readonly RunFile[]): Promise<{ projectId: number }> {
  const api = context.request;
  await api.get('/api/health');
  const id = randomUUID().slice(0, 8);
  const registered = await api.post('/api/auth/register', { data: { email: `series-${id}@ergodic-e2e.example`, password: `e2e-${randomUUID()}`, displayName: `Series reader ${id}` }, headers: await xsrf(context) });
  expect(registered.status(), await registered.text()).toBe(201);
  const made = await api.post('/api/projects', { data: { name: `Larkspur argon study ${id}` }, headers: await xsrf(context) });
  expect(made.status(), await made.text()).toBe(201);
  const projectId = ((await made.json()) as { project: { id: number } }).project.id;
  for (const run of runs) {
    const upload = await api.post(`/api/projects/${projectId}/trajectories`, {
      multipart: { temperatureK: String(run.temperatureK), file: { name: run.name, mimeType: 'chemical/x-extxyz', buffer: run.bytes } },
      headers: await xsrf(context),
    });
    expect(upload.status(), await upload.text()).toBe(201);
    const trajectoryId = ((await upload.json()) as { trajectory: TrajectoryDto }).trajectory.id;
    await expect.poll(async () => ((await (await api.get(`/api/trajectories/${trajectoryId}`)).json()) as { trajectory: TrajectoryDto }).trajectory.status,
      { message: `inspection of ${run.name}`, timeout: 60_000 }).toBe('ready');
  }
  return { projectId };
}
