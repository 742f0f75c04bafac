import { randomUUID } from 'node:crypto';
import { expect, type BrowserContext } from '@playwright/test';
import type { AnalysisKey } from '../../../shared/analysis-params.ts';
import type { AnalysisRunDto } from '../../../shared/analysis-run.ts';
import type { TrajectoryDto } from '../../../shared/trajectory.ts';

async function xsrf(context: BrowserContext): Promise<Record<string, string>> {
  const token = (await context.cookies()).find((c) => c.name === 'XSRF-TOKEN')?.value;
  if (!token) throw new Error('the server set no XSRF-TOKEN cookie');
  return { 'X-XSRF-TOKEN': decodeURIComponent(token) };
}

export interface SeededReport {
  reportId: number;
  projectId: number;
  displayName: string;
}

/**
 * Through the API, as a script would: a new account signed in within
 * `context`, a project, an uploaded trajectory, an analysis run waited for
 * until done. Returns the report the run wrote.
 */
export async function seedReport(context: BrowserContext, fileName: string, bytes: Buffer, analyses: AnalysisKey[]): Promise<SeededReport> {
  const api = context.request;
  await api.get('/api/health');
  const id = randomUUID().slice(0, 8);
  const displayName = `Report reader ${id}`;
  const registered = await api.post('/api/auth/register', { data: { email: `reports-${id}@ergodic-e2e.example`, password: `e2e-${randomUUID()}`, displayName }, headers: await xsrf(context) });
  expect(registered.status(), await registered.text()).toBe(201);
  const made = await api.post('/api/projects', { data: { name: `Reports ${id}` }, headers: await xsrf(context) });
  expect(made.status(), await made.text()).toBe(201);
  const projectId = ((await made.json()) as { project: { id: number } }).project.id;

  const upload = await api.post(`/api/projects/${projectId}/trajectories`, {
    multipart: { file: { name: fileName, mimeType: 'chemical/x-extxyz', buffer: bytes } }, headers: await xsrf(context),
  });
  expect(upload.status(), await upload.text()).toBe(201);
  const trajectoryId = ((await upload.json()) as { trajectory: TrajectoryDto }).trajectory.id;
  await expect.poll(async () => ((await (await api.get(`/api/trajectories/${trajectoryId}`)).json()) as { trajectory: TrajectoryDto }).trajectory.status, { timeout: 60_000 }).toBe('ready');

  const started = await api.post(`/api/trajectories/${trajectoryId}/analyses`, { data: { analyses }, headers: await xsrf(context) });
  expect(started.status(), await started.text()).toBe(202);
  const runId = ((await started.json()) as { job: AnalysisRunDto }).job.id;
  let run: AnalysisRunDto | null = null;
  await expect.poll(async () => {
    run = ((await (await api.get(`/api/jobs/${runId}`)).json()) as { job: AnalysisRunDto }).job;
    return run.status;
  }, { timeout: 180_000, intervals: [500, 1000] }).toMatch(/done|failed|cancelled/);
  expect(run!.error).toBeNull();
  expect(run!.reportId).not.toBeNull();
  return { reportId: run!.reportId!, projectId, displayName };
}
