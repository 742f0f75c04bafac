import { describe, expect, it } from 'vitest';
import { BOLTZMANN_ENGINE } from '../../../server/analysis/constants.ts';
import { msd } from '../../../server/analysis/msd.ts';
import { rdf } from '../../../server/analysis/rdf.ts';
import { thermo } from '../../../server/analysis/thermo.ts';
import { lennardJonesReducedUnits } from '../../../server/analysis/units.ts';
import { vacf } from '../../../server/analysis/vacf.ts';
import { vdos } from '../../../server/analysis/vdos.ts';
import { simulateLennardJones } from '../../../server/simulate/lennard-jones.ts';

// One real MD trajectory from our own integrator: LJ liquid near the triple point, ρ* = 0.8442,
// T* = 0.722, N = 500, r_c = 2.5σ shifted, Δt = 0.004τ, 40τ of NVE after melting and rescaling.
// Checks: SCIENCE item 20 (internal consistency, sources items 1–4), item 11 (literature ranges,
// FROM MEMORY: D* ≈ 0.03, g peak ≈ 3.0 at 1.08–1.10σ; Verlet 1967/68), item 22 (SELF-COMPUTED MD, not
// published: D* = 0.0331, VACF zero 0.133τ, g min 0.57 at 1.544σ, coordination 12.6).
describe('Lennard-Jones liquid near the triple point (SCIENCE items 11, 20, 22)', () => {
  const sigma = 3.405, epsK = 119.8, mass = 39.948;
  const run = simulateLennardJones({
    cellsPerSide: 5,
    reducedDensity: 0.8442,
    temperatureK: 0.722 * epsK,
    meltTemperatureK: 2.2 * epsK,
    meltSteps: 500,
    equilibrationSteps: 1500,
    productionSteps: 10_000,
    sampleEvery: 5,
    seed: 2025,
  });
  const traj = run.trajectory;
  const masses = { Ar: mass };
  const reduced = lennardJonesReducedUnits(sigma, epsK, mass);
  const m = msd(traj, { masses });
  const v = vacf(traj, { masses, removeComDrift: false });
  const dMsd = m.groups[0].diffusion.d?.a2PerPs ?? NaN;
  const dGk = v.groups[0].greenKubo.d.a2PerPs;

  it('when the NVE run is checked, then total energy drifts by less than 1e-3 ε per atom', () => {
    const e = run.potentialEV.map((p, i) => p + run.kineticEV[i]);
    const epsEV = (epsK * 8.617333262e-5);
    expect(Math.abs(e[e.length - 1] - e[0]) / traj.nAtoms).toBeLessThan(1e-3 * epsEV);
  });

  it('when D is taken from the MSD, then D* lies in 0.025–0.037 (item 11) and the window is automatic and diffusive', () => {
    expect(m.groups[0].diffusion.regime).toBe('diffusive');
    expect(dMsd / reduced.diffusionA2PerPs).toBeGreaterThan(0.025);
    expect(dMsd / reduced.diffusionA2PerPs).toBeLessThan(0.037);
  });

  it('when D is taken by Green–Kubo on the same trajectory, then it agrees with the MSD value within 10 % (item 20)', () => {
    expect(v.groups[0].greenKubo.converged).toBe(true);
    expect(Math.abs(dGk - dMsd) / dMsd).toBeLessThan(0.1);
  });

  it('when VACF(0) is compared with 3k_BT/m from the same velocities (N_dof = 3N), then they agree to 1e-10', () => {
    const t = thermo(traj, { masses, removeComDrift: false });
    expect(Math.abs(v.groups[0].vacfA2PerPs2[0] / ((3 * BOLTZMANN_ENGINE * t.temperature.mean) / mass) - 1)).toBeLessThan(1e-10);
    expect(t.temperature.mean / epsK).toBeGreaterThan(0.65);
    expect(t.temperature.mean / epsK).toBeLessThan(0.8);
  });

  it('when the VDOS is built, then ∫S = N_dof, and S(0) of the velocity spectrum over 20τ segments gives the automatic Green–Kubo plateau within 5 % (item 4)', () => {
    const s = vdos(traj, { masses, degreesOfFreedom: 3 * traj.nAtoms - 3 }).groups[0];
    expect(s.integral).toBeCloseTo(3 * traj.nAtoms - 3, 6);
    const segmented = vdos(traj, { masses, removeComDrift: false, maxLagPs: 10 * run.tauPs }).groups[0];
    expect(Math.abs(segmented.zeroFrequencyDA2PerPs / dGk - 1)).toBeLessThan(0.05);
  });

  it('when the VACF first crosses zero, then it is at 0.12–0.18 τ (item 10 range; item 22 self-computed 0.133τ)', () => {
    const c = v.groups[0].normalised;
    let k = 1;
    while (c[k] > 0) k++;
    const zero = v.lagPs[k - 1] + (c[k - 1] / (c[k - 1] - c[k])) * (v.lagPs[k] - v.lagPs[k - 1]);
    expect(zero / run.tauPs).toBeGreaterThan(0.12);
    expect(zero / run.tauPs).toBeLessThan(0.18);
  });

  it('when g(r) is computed, then the first peak is 3.0 ± 0.3 at 1.09 ± 0.03σ and ~12–13 neighbours lie within the first minimum', () => {
    const g = rdf(traj, { frameStride: 4, binWidthA: 0.05 }).total;
    expect(Math.abs((g.firstPeak?.g ?? 0) - 3.0)).toBeLessThan(0.3);
    expect(Math.abs((g.firstPeak?.rA ?? 0) / sigma - 1.09)).toBeLessThan(0.03);
    expect(Math.abs((g.firstMinimum?.rA ?? 0) / sigma - 1.54)).toBeLessThan(0.06);
    expect(g.firstMinimum?.coordination).toBeGreaterThan(12);
    expect(g.firstMinimum?.coordination).toBeLessThan(13.5);
  });
});
