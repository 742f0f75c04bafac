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

/**
 * Lennard-Jones argon, ε/k_B = 119.8 K (0.0103236 eV) and σ = 3.405 Å
 * (Rahman 1964, the usual argon parameters; COMMON PRACTICE), one self pair
 * per species so Lorentz–Berthelot mixing covers the rest.
 */
export function argonLikeModel(species: string[] = ['Ar']): { pairs: unknown[] } {
  return { pairs: species.map((s) => ({ species: [s, s], form: 'lj', epsilonEV: 0.0103236, sigmaA: 3.405, cutoffA: 8.5 })) };
}

export interface SeededProject {
  email: string;
  displayName: string;
  projectId: number;
  trajectoryId: number;
  reportId: number;
}

/**
 * Through the API, as a script would: a new account signed in within
 * `context`, a project with an interaction model, one uploaded trajectory
 * and a finished run of `analyses`.
 */
export async function seedProjectWithModel(context: BrowserContext, fileName: string, bytes: Buffer, analyses: AnalysisKey[], model: unknown, ensemble?: 'NVE' | 'NVT'): Promise<SeededProject> {
  const api = context.request;
  await api.get('/api/health');
  const id = randomUUID().slice(0, 8);
  const email = `energy-${id}@ergodic-e2e.example`;
  const displayName = `Energy reader ${id}`;
  const registered = await api.post('/api/auth/register', { data: { email, password: `e2e-${randomUUID()}`, displayName }, headers: await xsrf(context) });
  expect(registered.status(), await registered.text()).toBe(201);
  const made = await api.post('/api/projects', { data: { name: `Larkspur energetics ${id}` }, headers: await xsrf(context) });
  expect(made.status(), await made.text()).toBe(201);
  const projectId = ((await made.json()) as { project: { id: number } }).project.id;
  const modelSet = await api.put(`/api/projects/${projectId}/interaction-model`, { data: { model }, headers: await xsrf(context) });
  expect(modelSet.status(), await modelSet.text()).toBe(200);

  const upload = await api.post(`/api/projects/${projectId}/trajectories`, {
    multipart: { file: { name: fileName, mimeType: 'chemical/x-extxyz', buffer: bytes } }, headers: await xsrf(context),
  });
  expect(upload.status(), await upload.text()).toBe(201);
  const trajectoryId = ((await upload.json()) as { trajectory: TrajectoryDto }).trajectory.id;
  await expect.poll(async () => ((await (await api.get(`/api/trajectories/${trajectoryId}`)).json()) as { trajectory: TrajectoryDto }).trajectory.status,
    { message: `inspection of ${fileName}`, timeout: 60_000 }).toBe('ready');
  if (ensemble) {
    const patched = await api.patch(`/api/trajectories/${trajectoryId}`, { data: { ensemble }, headers: await xsrf(context) });
    expect(patched.status(), await patched.text()).toBe(200);
  }

  const started = await api.post(`/api/trajectories/${trajectoryId}/analyses`, { data: { analyses }, headers: await xsrf(context) });
  expect(started.status(), await started.text()).toBe(202);
  const runId = ((await started.json()) as { job: AnalysisRunDto }).job.id;
  let run: AnalysisRunDto | null = null;
  await expect.poll(async () => {
    run = ((await (await api.get(`/api/jobs/${runId}`)).json()) as { job: AnalysisRunDto }).job;
    return run.status;
  }, { message: `the run of ${analyses.join(', ')}`, timeout: 240_000, intervals: [500, 1000] }).toMatch(/done|failed|cancelled/);
  expect(run!.error).toBeNull();
  return { email, displayName, projectId, trajectoryId, reportId: run!.reportId! };
}
