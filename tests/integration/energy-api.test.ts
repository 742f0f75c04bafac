/**
 * The energy analysis through the API, against real MariaDB, Redis and the S3 fake: interaction models stored
 * with a project and a trajectory, validation that names the field, energies in the uploaded file found by
 * inspection, and a report whose summary, curves and methods carry the energies and the model.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startWorker, type RunningWorker } from '../../server/jobs/worker.ts';
import { writeExtxyz } from '../../server/formats/write-extxyz.ts';
import { simulateLennardJones } from '../../server/simulate/lennard-jones.ts';
import { trajectoryToFrames } from '../../server/simulate/to-frames.ts';
import { signUp, type TestAccount } from '../support/accounts.ts';
import { pollUntil } from '../support/poll.ts';
import { createTestApp } from '../support/test-app.ts';
import { energyCards } from '../../src/app/reports/energy-cards.ts';

const testApp = createTestApp();
let worker: RunningWorker;
let owner: TestAccount;
let outsider: TestAccount;
let projectId: number;

const ARGON = { pairs: [{ species: ['Ar', 'Ar'], form: 'lj', epsilonEV: 0.0103236, sigmaA: 3.405, cutoffA: 2.5 * 3.405, truncation: 'shifted' }] };

/** A small argon NVE run whose extended XYZ carries the integrator's own potential energy as energy= (eV). */
async function argonFile(withEnergy: boolean): Promise<Buffer> {
  const run = simulateLennardJones({ cellsPerSide: 3, reducedDensity: 0.8442, temperatureK: 86.5, meltTemperatureK: 250, meltSteps: 200, equilibrationSteps: 300, productionSteps: 1500, sampleEvery: 5, seed: 17 });
  const chunks: Uint8Array[] = [];
  for await (const c of writeExtxyz(trajectoryToFrames(run.trajectory, withEnergy ? { energy: run.potentialEV } : {}))) chunks.push(c);
  return Buffer.concat(chunks);
}

async function upload(name: string, bytes: Buffer, fields: Record<string, string> = {}): Promise<number> {
  let req = owner.client.raw('post', `/api/projects/${projectId}/trajectories`);
  for (const [k, v] of Object.entries(fields)) req = req.field(k, v);
  const res = await req.attach('file', bytes, name);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  const id = res.body.trajectory.id as number;
  await pollUntil(() => owner.client.get(`/api/trajectories/${id}`), (r) => r.body.trajectory.status !== 'inspecting' && r.body.trajectory.status !== 'uploading');
  return id;
}

async function analyse(id: number, analyses: string[], params: Record<string, unknown> = {}) {
  const res = await owner.client.post(`/api/trajectories/${id}/analyses`, { analyses, params });
  expect(res.status, JSON.stringify(res.body)).toBe(202);
  const job = await pollUntil(() => owner.client.get(`/api/jobs/${res.body.job.id}`), (r) => ['done', 'failed'].includes(r.body.job.status), 120_000);
  expect(job.body.job.error).toBeNull();
  return (await owner.client.get(`/api/reports/${job.body.job.reportId}`)).body.report;
}

beforeAll(async () => {
  worker = await startWorker(testApp.config, testApp.ctx.log);
  owner = await signUp(testApp.app, 'energy-owner');
  outsider = await signUp(testApp.app, 'energy-outsider');
  const p = await owner.client.post('/api/projects', { name: 'Energetics' });
  projectId = p.body.project.id;
}, 120_000);

afterAll(async () => {
  await worker.close();
  await testApp.close();
});

describe('interaction models and the energy analysis through the API', () => {
  let fileId: number;

  it('when a model with a wrong field is sent, then 400 names the pair and the field; presets list their sources', async () => {
    const bad = await owner.client.send('put', `/api/projects/${projectId}/interaction-model`, { model: { pairs: [{ species: ['Ar', 'Ar'], form: 'lj', epsilonEV: 0.01, sigma: 3.4, cutoffA: 10 }] } });
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toMatch(/pairs\[0\] \(Ar–Ar\): unknown field sigma \(lengths carry their unit: sigmaA or sigmaNm\)/);
    expect(bad.body.error.details).toContainEqual({ field: 'pairs[0] (Ar–Ar)', message: expect.stringMatching(/unknown field sigma/) });
    const presets = await owner.client.get('/api/interaction-model-presets');
    expect(presets.status).toBe(200);
    expect(presets.body.presets.map((p: { id: string }) => p.id)).toContain('argon-lj-rnp');
    expect(presets.body.presets.find((p: { id: string }) => p.id === 'argon-lj-rnp').source).toMatch(/Rowley, D. Nicholson & N. G. Parsonage, J. Comput. Phys. 17, 401/);
  });

  it('when a file states energy= per frame, then inspection lists the key; an energy run without any model still works from the file, and one with neither is refused', async () => {
    fileId = await upload('argon-energies.extxyz', await argonFile(true), { ensemble: 'NVE' });
    const t = await owner.client.get(`/api/trajectories/${fileId}`);
    expect(t.body.trajectory.fileValues).toEqual(['energy']);
    expect(t.body.trajectory.interactionModelSource).toBeNull();
    const report = await analyse(fileId, ['energy']);
    expect(report.summary.energy.sources.potential).toBe('file');
    expect(report.summary.energy.pressureBar).toBeNull();
    const bare = await upload('argon-bare.extxyz', await argonFile(false));
    const refused = await owner.client.post(`/api/trajectories/${bare}/analyses`, { analyses: ['energy'] });
    expect(refused.status).toBe(400);
    expect(refused.body.error.message).toMatch(/has no interaction model and its file states no energies/);
  });

  it('when the project has a model, then its trajectories use it; the report gives U, P with block errors, drift, C_V (NVE), the file comparison, curves and the model in its methods', async () => {
    const put = await owner.client.send('put', `/api/projects/${projectId}/interaction-model`, { model: ARGON });
    expect(put.status, JSON.stringify(put.body)).toBe(200);
    const view = await owner.client.get(`/api/trajectories/${fileId}/interaction-model`);
    expect(view.body.interactionModel).toMatchObject({ source: 'project', problem: null });
    expect(view.body.interactionModel.pairs[0]).toMatchObject({ form: 'lj', species: ['Ar', 'Ar'], origin: 'given', truncation: 'shifted' });
    const report = await analyse(fileId, ['thermo', 'energy']);
    const e = report.summary.energy;
    expect(e.sources).toMatchObject({ potential: 'model', kinetic: 'stored velocities', pressure: 'virial' });
    for (const q of [e.potentialPerAtomEV, e.pressureBar, e.totalPerAtomEV]) {
      expect(Number.isFinite(q.mean)).toBe(true);
      expect(q.stdError).toBeGreaterThan(0);
    }
    expect(e.potentialPerAtomEV.mean).toBeLessThan(-0.05);
    expect(e.comparisons[0]).toMatchObject({ quantity: 'potential energy', agree: true });
    expect(e.nveCheck.thresholdSource).toBe('default (common practice)');
    expect(e.heatCapacity.method).toMatch(/Lebowitz–Percus–Verlet/);
    expect(report.methods.energy.interactionModel.pairs[0].epsilonEV).toBe(0.0103236);
    expect(report.params.interactionModel).toBeDefined();
    expect(report.curves.energy.columns).toEqual(expect.arrayContaining(['time', 'potential energy', 'kinetic energy', 'total energy', 'pressure', 'pressure xy']));
    const csv = await owner.client.get(`/api/reports/${report.id}/curves/energy.csv`);
    expect(csv.status).toBe(200);
    expect(csv.text.split('\n')[0]).toMatch(/potential energy \(eV\/atom\)/);
  });

  it('when the trajectory gets its own model, then it wins over the project\'s; deleting it falls back to the project\'s', async () => {
    const own = { ...ARGON, pairs: [{ ...ARGON.pairs[0], cutoffA: 9 }] };
    expect((await owner.client.send('put', `/api/trajectories/${fileId}/interaction-model`, { model: own })).body.interactionModel.source).toBe('trajectory');
    expect((await owner.client.get(`/api/trajectories/${fileId}`)).body.trajectory.interactionModelSource).toBe('trajectory');
    expect((await owner.client.delete(`/api/trajectories/${fileId}/interaction-model`)).body.interactionModel.source).toBe('project');
  });

  it('when a model lacks a pair the trajectory needs, then the view says which and the run is refused before queueing', async () => {
    await owner.client.send('put', `/api/trajectories/${fileId}/interaction-model`, { model: { pairs: [{ species: ['Ne', 'Ne'], form: 'lj', epsilonK: 36, sigmaA: 2.8, cutoffA: 8 }] } });
    const view = await owner.client.get(`/api/trajectories/${fileId}/interaction-model`);
    expect(view.body.interactionModel.problem).toMatch(/no potential for Ar–Ar/);
    const refused = await owner.client.post(`/api/trajectories/${fileId}/analyses`, { analyses: ['energy'] });
    expect(refused.status).toBe(400);
    expect(refused.body.error.message).toMatch(/no potential for Ar–Ar/);
    await owner.client.delete(`/api/trajectories/${fileId}/interaction-model`);
  });

  it('when a non-member asks for or writes a model, then the project is invisible to them (404)', async () => {
    expect((await outsider.client.get(`/api/trajectories/${fileId}/interaction-model`)).status).toBe(404);
    expect((await outsider.client.send('put', `/api/projects/${projectId}/interaction-model`, { model: ARGON })).status).toBe(404);
  });
});

describe('what the energy report says when file and model differ', () => {
  let fileId: number;

  /** The argon run with its own potential energy (eV) and a pressure column the file states (bar). */
  async function argonWithPressure(): Promise<Buffer> {
    const run = simulateLennardJones({ cellsPerSide: 3, reducedDensity: 0.8442, temperatureK: 86.5, meltTemperatureK: 250, meltSteps: 200, equilibrationSteps: 300, productionSteps: 1000, sampleEvery: 5, seed: 23 });
    const press = Float64Array.from({ length: run.potentialEV.length }, (_, f) => 1.01325 + 0.001 * (f % 3));
    const chunks: Uint8Array[] = [];
    for await (const c of writeExtxyz(trajectoryToFrames(run.trajectory, { energy: run.potentialEV, press }))) chunks.push(c);
    return Buffer.concat(chunks);
  }

  beforeAll(async () => {
    // A project of its own, so no stored model of the tests above applies.
    const p = await owner.client.post('/api/projects', { name: 'Energetics, file against model' });
    projectId = p.body.project.id;
    fileId = await upload('argon-pressure.extxyz', await argonWithPressure(), { ensemble: 'NVE' });
    expect((await owner.client.get(`/api/trajectories/${fileId}`)).body.trajectory.fileValues).toEqual(['energy', 'press']);
  }, 120_000);

  const fromFile = { potentialEnergy: { key: 'energy', unit: 'eV' }, pressure: { key: 'press', unit: 'bar' } };

  it('when the file states a pressure and there is no model to give a virial, then the summary and the pressure card say the file\'s pressure is shown and why there is no tensor', async () => {
    const report = await analyse(fileId, ['energy'], { fileQuantities: fromFile });
    const e = report.summary.energy;
    expect(e.sources).toMatchObject({ potential: 'file', pressure: 'file' });
    expect(e.pressureTensorBar).toBeNull();
    expect(e.pressureBar.mean).toBeCloseTo(1.01425, 3);
    expect(e.pressureNote).toBe('Shown: the pressure as the file states it, key "press" in bar, a scalar per frame without a tensor; there is no interaction model, so no virial pressure and no pressure tensor (both need the pair forces).');
    const card = energyCards(report.summary).find((c) => c.id === 'energy-pressure')!;
    expect(card.title).toBe('Pressure (from the file)');
    expect(card.detail).toBe(e.pressureNote);
  });

  it('when a model gives the virial beside the file\'s pressure, then both are compared, and where they disagree the card gives both values', async () => {
    const report = await analyse(fileId, ['energy'], { fileQuantities: fromFile, interactionModel: ARGON });
    const e = report.summary.energy;
    expect(e.sources).toMatchObject({ potential: 'model', pressure: 'virial' });
    expect(e.pressureTensorBar).not.toBeNull();
    expect(e.pressureNote).toBe('Shown: the virial pressure and its tensor from the interaction model, beside the file\'s pressure (key "press" in bar).');
    // The stated 1 bar is not the dense liquid's virial pressure: the report says so with both numbers.
    const pressure = e.comparisons.find((c: { quantity: string }) => c.quantity === 'pressure');
    expect(pressure).toMatchObject({ agree: false });
    expect(pressure.fileMean).toBeCloseTo(1.01425, 3);
    expect(pressure.modelMean).toBeCloseTo(e.pressureBar.mean, 6);
    const card = energyCards(report.summary).find((c) => c.id === 'energy-pressure')!;
    expect(card.warning).toContain(`File and model disagree on the pressure: file 1.014 bar, model `);
    // The same model the integrator used: the potential energies agree.
    expect(e.comparisons.find((c: { quantity: string }) => c.quantity === 'potential energy')).toMatchObject({ agree: true });
  });

  it('when the file\'s energies and the model\'s disagree, then the API summary gives both means and the potential-energy card warns with both values', async () => {
    const stronger = { pairs: [{ ...ARGON.pairs[0], epsilonEV: 0.0103236 * 1.1 }] };
    const report = await analyse(fileId, ['energy'], { fileQuantities: fromFile, interactionModel: stronger });
    const c = report.summary.energy.comparisons.find((x: { quantity: string }) => x.quantity === 'potential energy');
    expect(c.agree).toBe(false);
    // U is linear in ε: 10 % more ε gives 10 % more (negative) potential energy; the file matches the
    // unchanged model to ~1e-5 relative (positions stored as 32-bit floats), hence 4 decimals here.
    expect(c.modelMean / c.fileMean).toBeCloseTo(1.1, 4);
    expect(report.summary.energy.potentialPerAtomEV.mean).toBeCloseTo(c.modelMean, 9);
    const card = energyCards(report.summary).find((x) => x.id === 'energy-potential')!;
    expect(card.warning).toMatch(/^File and model disagree on the potential energy: file -0\.05\d+ eV\/atom, model -0\.05\d+ eV\/atom \(mean difference/);
    expect(card.warning).toMatch(/Check units, cut-off, shift and tail conventions\.$/);
  });
});
