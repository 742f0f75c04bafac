import { randomUUID } from 'node:crypto';
import type { APIRequestContext } from '@playwright/test';

/** Signed-in browser state and the trajectory to open. */
export interface ViewerUpload {
  state: Awaited<ReturnType<APIRequestContext['storageState']>>;
  trajectoryId: number;
}

async function xsrf(api: APIRequestContext): Promise<Record<string, string>> {
  const token = (await api.storageState()).cookies.find((c) => c.name === 'XSRF-TOKEN')?.value;
  if (!token) throw new Error('the server set no XSRF-TOKEN cookie');
  return { 'X-XSRF-TOKEN': decodeURIComponent(token) };
}

async function expectStatus(res: { status(): number; text(): Promise<string> }, status: number, what: string): Promise<void> {
  if (res.status() !== status) throw new Error(`${what}: HTTP ${res.status()} ${await res.text()}`);
}

/** Signs up (once per request context), uploads a file and waits for its inspection to finish. */
export async function uploadForViewer(api: APIRequestContext, fileName: string, bytes: Buffer, timeoutMs = 300_000): Promise<ViewerUpload> {
  await api.get('/api/health');
  const id = randomUUID().slice(0, 8);
  if (!(await api.get('/api/auth/me')).ok()) {
    const reg = await api.post('/api/auth/register', {
      data: { email: `bench-${id}@ergodic-bench.example`, password: `bench-${randomUUID()}`, displayName: 'Viewer bench' }, headers: await xsrf(api),
    });
    await expectStatus(reg, 201, 'sign-up');
  }
  const project = await api.post('/api/projects', { data: { name: `Viewer bench ${id}` }, headers: await xsrf(api) });
  await expectStatus(project, 201, 'new project');
  const projectId = ((await project.json()) as { project: { id: number } }).project.id;
  const upload = await api.post(`/api/projects/${projectId}/trajectories`, {
    multipart: { file: { name: fileName, mimeType: 'chemical/x-extxyz', buffer: bytes } }, headers: await xsrf(api), timeout: timeoutMs,
  });
  await expectStatus(upload, 201, `upload of ${fileName}`);
  const trajectoryId = ((await upload.json()) as { trajectory: { id: number } }).trajectory.id;
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const { trajectory: t } = (await (await api.get(`/api/trajectories/${trajectoryId}`)).json()) as { trajectory: { status: string; error: string | null } };
    if (t.status === 'ready') break;
    if (t.status === 'failed') throw new Error(`inspection of ${fileName} failed: ${t.error}`);
    if (Date.now() > deadline) throw new Error(`inspection of ${fileName} did not finish in ${timeoutMs / 1000} s`);
    await new Promise((r) => setTimeout(r, 500));
  }
  return { state: await api.storageState(), trajectoryId };
}
