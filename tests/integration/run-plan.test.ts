import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startWorker, type RunningWorker } from '../../server/jobs/worker.ts';
import { signUp, type TestAccount } from '../support/accounts.ts';
import { lennardJonesExtxyz } from '../support/fixtures.ts';
import { pollUntil } from '../support/poll.ts';
import { relaxingRunExtxyz } from '../support/relaxing-run.ts';
import { createTestApp } from '../support/test-app.ts';

// A small ceiling, so a modest request is already past it.
const testApp = createTestApp({ ANALYSIS_MAX_SECONDS: '0.01' });
const { app, ctx } = testApp;
let worker: RunningWorker;
let owner: TestAccount;
let projectId: number;
let liquidId: number;
let liquidFrames: number;
let liquidStep: number;

async function uploadReady(bytes: Buffer, name: string) {
  const res = await owner.client.raw('post', `/api/projects/${projectId}/trajectories`).attach('file', bytes, name);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  const ready = await pollUntil(() => owner.client.get(`/api/trajectories/${res.body.trajectory.id}`), (r) => r.body.trajectory.status !== 'inspecting');
  expect(ready.body.trajectory.status, JSON.stringify(ready.body)).toBe('ready');
  return ready.body.trajectory;
}

beforeAll(async () => {
  worker = await startWorker(testApp.config, ctx.log);
  owner = await signUp(app, 'run-plan');
  projectId = (await owner.client.post('/api/projects', { name: 'Run plans' })).body.project.id;
  const liquid = await uploadReady((await lennardJonesExtxyz({ productionSteps: 1000 })).bytes, 'liquid.extxyz');
  liquidId = liquid.id;
  liquidFrames = liquid.frames;
  liquidStep = liquid.timeStep;
});
afterAll(async () => {
  await worker.close();
  await testApp.close();
});

describe('frame range, stride and discard, and the cost before queueing', () => {
  it('when a run is estimated, then time, memory and the frames it would use come back, and nothing is queued', async () => {
    const res = await owner.client.post(`/api/trajectories/${liquidId}/analyses/estimate`, { analyses: ['thermo', 'msd'], params: { fromFrame: 10, frameStride: 2, discardPs: 0.05 } });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const { estimate } = res.body;
    expect(estimate.seconds).toBeGreaterThan(0);
    expect(estimate.memoryBytes).toBeGreaterThan(0);
    expect(estimate.analyses.map((a: { key: string }) => a.key)).toEqual(['thermo', 'msd']);
    expect(estimate.frames).toMatchObject({ stride: 2, to: liquidFrames, autoStride: false });
    expect(estimate.frames.from).toBeGreaterThan(10);
    expect(estimate.withinLimits).toBe(true);
    expect((await owner.client.get(`/api/trajectories/${liquidId}/analyses`)).body.jobs).toEqual([]);
  });

  it('when a selection cannot work, then starting is refused with 422 naming what to change', async () => {
    const res = await owner.client.post(`/api/trajectories/${liquidId}/analyses`, { analyses: ['msd'], params: { toFrame: liquidFrames + 1 } });
    expect(res.status).toBe(422);
    expect(res.body.error.message).toMatch(/toFrame \d+ is past the end/);
  });

  it('when a run would be past the site\'s limits, then it is refused with 422, its estimate and advice, and never queued', async () => {
    const res = await owner.client.post(`/api/trajectories/${liquidId}/analyses`, { analyses: ['rdf', 'lindemann', 'msd', 'vacf'], params: { frameStride: 1 } });
    expect(res.status, JSON.stringify(res.body)).toBe(422);
    expect(res.body.error.code).toBe('too_costly');
    expect(res.body.error.message).toMatch(/This run would take about .* of work \(the limit is 1 s\)/);
    expect(res.body.error.details.estimate.withinLimits).toBe(false);
    expect(res.body.error.details.estimate.advice.length).toBeGreaterThan(0);
    expect((await owner.client.get(`/api/trajectories/${liquidId}/analyses`)).body.jobs).toEqual([]);
  });

  it('when a run selects frames, then the engine sees only those and the report says which', async () => {
    const res = await owner.client.post(`/api/trajectories/${liquidId}/analyses`, { analyses: ['thermo'], params: { fromFrame: 10, toFrame: 90, frameStride: 3 } });
    expect(res.status, JSON.stringify(res.body)).toBe(202);
    const job = (await pollUntil(() => owner.client.get(`/api/jobs/${res.body.job.id}`), (r) => ['done', 'failed'].includes(r.body.job.status), 120_000)).body.job;
    expect([job.status, job.error]).toEqual(['done', null]);
    expect(job.params).toMatchObject({ fromFrame: 10, toFrame: 90, frameStride: 3 });
    const report = (await owner.client.get(`/api/reports/${job.reportId}`)).body.report;
    expect(report.methods.frames).toMatchObject({ from: 10, to: 90, stride: 3, used: 27 });
    const times = report.curves.thermo.data[0] as number[];
    expect(times).toHaveLength(27);
    expect(times[1]! - times[0]!).toBeCloseTo(3 * liquidStep, 6);
  });

  it('when a run starts far from equilibrium, then inspection suggests where to start, judged from the kinetic energy', async () => {
    const t = await uploadReady(await relaxingRunExtxyz(), 'relaxing.extxyz');
    expect(t.equilibration.judgedFrom).toBe('the kinetic energy');
    // The excess decays as e^(−f/30): below the scatter of the kinetic energy well before frame 300.
    expect(t.equilibration.frame).toBeGreaterThan(40);
    expect(t.equilibration.frame).toBeLessThan(250);
  });
});
