import { randomUUID } from 'node:crypto';
import { expect, type APIRequestContext, type BrowserContext } from '@playwright/test';
import type { TrajectoryDto } from '../../../shared/trajectory.ts';

/** Writes through the API the way the app does: the XSRF cookie echoed in a header. */
async function xsrfHeader(context: BrowserContext): Promise<Record<string, string>> {
  const token = (await context.cookies()).find((c) => c.name === 'XSRF-TOKEN')?.value;
  if (!token) throw new Error('the server set no XSRF-TOKEN cookie');
  return { 'X-XSRF-TOKEN': decodeURIComponent(token) };
}

async function postJson<T>(api: APIRequestContext, context: BrowserContext, path: string, data: unknown): Promise<T> {
  const res = await api.post(path, { data, headers: await xsrfHeader(context) });
  expect(res.status(), await res.text()).toBe(201);
  return (await res.json()) as T;
}

/**
 * A new account, signed in within `context`, owning a project with the given
 * trajectory uploaded. Returns the trajectory once its inspection has settled
 * (ready or failed).
 */
export async function settledTrajectory(context: BrowserContext, fileName: string, bytes: Buffer, timeoutMs = 60_000): Promise<TrajectoryDto> {
  const api = context.request;
  await api.get('/api/health');
  const id = randomUUID().slice(0, 8);
  await postJson(api, context, '/api/auth/register', { email: `viewer-${id}@ergodic-e2e.example`, password: `e2e-${randomUUID()}`, displayName: `Viewer ${id}` });
  const { project } = await postJson<{ project: { id: number } }>(api, context, '/api/projects', { name: `Viewer ${id}` });
  const upload = await api.post(`/api/projects/${project.id}/trajectories`, {
    multipart: { file: { name: fileName, mimeType: 'chemical/x-extxyz', buffer: bytes } },
    headers: await xsrfHeader(context),
  });
  expect(upload.status(), await upload.text()).toBe(201);
  const created = ((await upload.json()) as { trajectory: TrajectoryDto }).trajectory;
  let trajectory = created;
  await expect.poll(async () => {
    trajectory = ((await (await api.get(`/api/trajectories/${created.id}`)).json()) as { trajectory: TrajectoryDto }).trajectory;
    return trajectory.status;
  }, { message: `inspection of ${fileName}`, timeout: timeoutMs }).toMatch(/ready|failed/);
  return trajectory;
}

/** As settledTrajectory, and the inspection must have succeeded. */
export async function readyTrajectory(context: BrowserContext, fileName: string, bytes: Buffer): Promise<TrajectoryDto> {
  const trajectory = await settledTrajectory(context, fileName, bytes);
  expect(trajectory.error).toBeNull();
  expect(trajectory.status).toBe('ready');
  return trajectory;
}
