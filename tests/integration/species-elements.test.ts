/**
 * Species → element through the API: inspection guesses only from case-exact
 * symbols and lists every assumption, the metadata PATCH confirms or changes
 * element and mass (refusing what is not a symbol or not a species), and the
 * analysis job uses the confirmed masses, recorded in the run's parameters.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startWorker, type RunningWorker } from '../../server/jobs/worker.ts';
import { signUp, type TestAccount } from '../support/accounts.ts';
import { pollUntil } from '../support/poll.ts';
import { createTestApp } from '../support/test-app.ts';

const testApp = createTestApp();
let worker: RunningWorker;
let owner: TestAccount;
let projectId: number;

// CODATA 2018 exact k_B and the 2018 atomic mass constant.
const BOLTZMANN_J_PER_K = 1.380649e-23;
const KG_PER_U = 1.6605390666e-27;
const LABELS = ['CA', 'Ca', 'bead', 'NE'] as const;

/** Four atoms, one of each label, with fixed velocities (Å/ps) in every frame, so the kinetic temperature is exact. */
const VELOCITIES = [[1, 2, 0], [0, -3, 1], [2, 0, -2], [-1, 1, 1]];
function file(): Buffer {
  const lines: string[] = [];
  for (let f = 0; f < 40; f++) {
    lines.push('4', `Lattice="20 0 0 0 20 0 0 0 20" Properties=species:S:1:pos:R:3:vel:R:3 Time=${(f * 0.01).toFixed(2)}`);
    LABELS.forEach((l, i) => lines.push(`${l} ${(2 + 4 * i + 0.01 * f * VELOCITIES[i]![0]!).toFixed(4)} ${(5 + 0.01 * f * VELOCITIES[i]![1]!).toFixed(4)} ${(5 + 0.01 * f * VELOCITIES[i]![2]!).toFixed(4)} ${VELOCITIES[i]!.join(' ')}`));
  }
  return Buffer.from(lines.join('\n') + '\n');
}

/** T = Σ m v² / (k_B · 3N), no centre-of-mass removal: the masses alone decide it. */
function temperatureFor(massesU: readonly number[]): number {
  const sum = massesU.reduce((acc, m, i) => acc + m * VELOCITIES[i]!.reduce((s, v) => s + v * v, 0), 0);
  return (sum * KG_PER_U * 1e4) / (BOLTZMANN_J_PER_K * 3 * massesU.length);
}

async function runThermo(id: number) {
  const res = await owner.client.post(`/api/trajectories/${id}/analyses`, { analyses: ['thermo'], params: { removeComDrift: false, degreesOfFreedom: 12 } });
  return res;
}

beforeAll(async () => {
  worker = await startWorker(testApp.config, testApp.ctx.log);
  owner = await signUp(testApp.app, 'element-owner');
  projectId = (await owner.client.post('/api/projects', { name: 'Atom names' })).body.project.id;
}, 120_000);

afterAll(async () => {
  await worker.close();
  await testApp.close();
});

describe('species elements', () => {
  let id: number;

  it('when a file labels atoms CA, Ca, bead and NE, then inspection lists CA → C and NE → N as assumed, Ca as exact, bead as unknown: never calcium or neon from capitals', async () => {
    const res = await owner.client.raw('post', `/api/projects/${projectId}/trajectories`).attach('file', file(), 'names.extxyz');
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    id = res.body.trajectory.id;
    const ready = await pollUntil(() => owner.client.get(`/api/trajectories/${id}`), (r) => r.body.trajectory.status === 'ready' || r.body.trajectory.status === 'failed');
    const t = ready.body.trajectory;
    expect(t.status).toBe('ready');
    expect(t.speciesElements).toEqual({
      CA: { element: 'C', massU: 12.011, status: 'assumed' },
      Ca: { element: 'Ca', massU: 40.078, status: 'exact' },
      bead: { element: null, massU: null, status: 'unknown' },
      NE: { element: 'N', massU: 14.007, status: 'assumed' },
    });
  });

  it('when a species has neither element nor mass, then starting an analysis is refused (422) naming it, and nothing is queued', async () => {
    const res = await runThermo(id);
    expect(res.status).toBe(422);
    expect(res.body.error.message).toMatch(/species "bead" names no element.*metadata/);
    const runs = await owner.client.get(`/api/trajectories/${id}/analyses`);
    expect(runs.body.jobs).toHaveLength(0);
  });

  it.each([
    [{ CA: { element: 'CA' } }, 'speciesElements.CA.element', /element symbol, case and all/],
    [{ bead: { element: null } }, 'speciesElements.bead.massU', /give a mass/],
    [{ XX: { element: 'C' } }, 'speciesElements.XX', /"XX" is not a species of names\.extxyz; its species are CA, Ca, bead, NE/],
    [{ CA: { element: 'C', massU: -2 } }, 'speciesElements.CA.massU', /above 0 u/],
  ])('when the metadata gives %j, then it is refused with 400 naming %s and nothing changes', async (speciesElements, field, message) => {
    const res = await owner.client.patch(`/api/trajectories/${id}`, { speciesElements });
    expect(res.status).toBe(400);
    expect(res.body.error.details.map((d: { field: string }) => d.field)).toContain(field);
    expect(res.body.error.message).toMatch(message);
    const t = (await owner.client.get(`/api/trajectories/${id}`)).body.trajectory;
    expect(t.speciesElements.CA.status).toBe('assumed');
  });

  it('when the user confirms CA as calcium and gives the bead 72 u, then they are stored as confirmed, the other species keep their guesses, and the job uses those masses', async () => {
    const res = await owner.client.patch(`/api/trajectories/${id}`, { speciesElements: { CA: { element: 'Ca' }, bead: { element: null, massU: 72 } } });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.trajectory.speciesElements).toEqual({
      CA: { element: 'Ca', massU: 40.078, status: 'confirmed' },
      Ca: { element: 'Ca', massU: 40.078, status: 'exact' },
      bead: { element: null, massU: 72, status: 'confirmed' },
      NE: { element: 'N', massU: 14.007, status: 'assumed' },
    });
    const start = await runThermo(id);
    expect(start.status, JSON.stringify(start.body)).toBe(202);
    // Only what differs from the labels' own reading is written into the run's settings.
    expect(start.body.job.params.masses).toEqual({ CA: 40.078, bead: 72 });
    const job = await pollUntil(() => owner.client.get(`/api/jobs/${start.body.job.id}`), (r) => ['done', 'failed'].includes(r.body.job.status), 120_000);
    expect(job.body.job.error).toBeNull();
    const report = (await owner.client.get(`/api/reports/${job.body.job.reportId}`)).body.report;
    const expected = temperatureFor([40.078, 40.078, 72, 14.007]);
    expect(report.summary.thermo.temperatureK.mean).toBeCloseTo(expected, 2);
    expect(report.params.masses).toEqual({ CA: 40.078, bead: 72 });
  });

  it('when a run names its own mass for a species, then that mass wins over the stored one', async () => {
    const start = await owner.client.post(`/api/trajectories/${id}/analyses`, { analyses: ['thermo'], params: { masses: { CA: 12 } } });
    expect(start.status, JSON.stringify(start.body)).toBe(202);
    expect(start.body.job.params.masses).toEqual({ CA: 12, bead: 72 });
  });
});
