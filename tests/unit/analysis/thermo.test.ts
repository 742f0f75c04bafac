import { describe, expect, it } from 'vitest';
import { arrhenius } from '../../../server/analysis/arrhenius.ts';
import { blockAverage } from '../../../server/analysis/block-average.ts';
import { BOLTZMANN_ENGINE } from '../../../server/analysis/constants.ts';
import { thermo } from '../../../server/analysis/thermo.ts';
import { SeededRandom } from '../../../server/simulate/random.ts';
import { cubicCells } from './synthetic.ts';
import type { Trajectory } from '../../../server/analysis/trajectory.ts';

function withVelocities(n: number, frames: number, fill: (f: number, i: number, rng: SeededRandom, out: Float64Array) => void, seed = 1, species = 'Ar'): Trajectory {
  const rng = new SeededRandom(seed);
  const velocities = new Float32Array(3 * n * frames);
  const v = new Float64Array(3);
  for (let f = 0; f < frames; f++)
    for (let i = 0; i < n; i++) {
      fill(f, i, rng, v);
      velocities.set(v, 3 * (n * f + i));
    }
  return { nAtoms: n, nFrames: frames, species: new Array<string>(n).fill(species), positions: new Float32Array(3 * n * frames), velocities, cells: cubicCells(frames, 30), times: Float64Array.from({ length: frames }, (_, f) => f * 0.01), boundary: 'periodic' };
}

// SCIENCE item 8: T = 2·KE/(N_dof·k_B) [COMMON PRACTICE; Allen & Tildesley 2017, FROM MEMORY for the section].
describe('Kinetic temperature by equipartition (SCIENCE item 8)', () => {
  it('when every atom has speed √(3k_BT0/m) in a random direction, then T = T0 to 1e-12 with N_dof = 3N', () => {
    const m = 39.95, T0 = 300;
    const speed = Math.sqrt((3 * BOLTZMANN_ENGINE * T0) / m);
    const dir = new Float64Array(3);
    const traj = withVelocities(100, 3, (_f, _i, rng, out) => {
      rng.unitVector(dir);
      for (let c = 0; c < 3; c++) out[c] = speed * dir[c];
    });
    // Velocities are stored in Float32: the check is on the engine's arithmetic, so the
    // expectation is recomputed from the stored numbers.
    const v = traj.velocities as Float32Array;
    let sum = 0;
    for (let i = 0; i < 300; i++) sum += m * v[i] * v[i];
    const exact = sum / (300 * BOLTZMANN_ENGINE);
    const r = thermo(traj, { removeComDrift: false });
    expect(r.degreesOfFreedom).toBe(300);
    expect(Math.abs(r.temperatureK[0] / exact - 1)).toBeLessThan(1e-12);
    expect(Math.abs(r.temperatureK[0] / T0 - 1)).toBeLessThan(1e-6);
  });

  it('when argon is at 300 K, then v_rms = √(3k_BT/m) = 432.80 m/s [DERIVED]', () => {
    expect(Math.sqrt((3 * BOLTZMANN_ENGINE * 300) / 39.948) * 100).toBeCloseTo(432.8, 1);
  });

  it('when COM velocity is removed from Maxwell–Boltzmann samples, then 3N − 3 gives an unbiased T and 3N is low by (3N−3)/3N', () => {
    const n = 1000, frames = 200, T0 = 120, m = 39.95;
    const s = Math.sqrt((BOLTZMANN_ENGINE * T0) / m);
    const rng = new SeededRandom(8);
    const velocities = new Float32Array(3 * n * frames);
    for (let f = 0; f < frames; f++) {
      const base = 3 * n * f;
      const mean = [0, 0, 0];
      for (let i = 0; i < 3 * n; i++) (velocities[base + i] = s * rng.normal()), (mean[i % 3] += velocities[base + i] / n);
      for (let i = 0; i < 3 * n; i++) velocities[base + i] -= mean[i % 3];
    }
    const traj: Trajectory = { nAtoms: n, nFrames: frames, species: new Array<string>(n).fill('Ar'), positions: new Float32Array(3 * n * frames), velocities, cells: cubicCells(frames, 40), times: Float64Array.from({ length: frames }, (_, f) => f), boundary: 'periodic' };
    const unbiased = thermo(traj);
    const biased = thermo(traj, { removeComDrift: false });
    expect(unbiased.degreesOfFreedom).toBe(2997);
    expect(Math.abs(unbiased.temperature.mean / T0 - 1)).toBeLessThan(4 * unbiased.temperature.stdError / T0);
    expect(biased.temperature.mean / unbiased.temperature.mean).toBeCloseTo(2997 / 3000, 12);
    // std(T)/T = √(2/(3N)) per frame = 2.58 % for N = 1000.
    const t = unbiased.temperatureK;
    const mean = t.reduce((a, b) => a + b) / frames;
    const sd = Math.sqrt(t.reduce((a, b) => a + (b - mean) ** 2, 0) / (frames - 1));
    expect(sd / mean).toBeGreaterThan(0.0258 * 0.8);
    expect(sd / mean).toBeLessThan(0.0258 * 1.2);
    expect(unbiased.equilibration.equilibrated).toBe(true);
  });

  it('when molecules are rigid 3-site waters, then N_dof = 6·N_mol − 3', () => {
    const traj = withVelocities(30, 2, (_f, _i, _r, out) => out.fill(1), 1, 'O');
    expect(thermo(traj, { constraints: 3 * 10 }).degreesOfFreedom).toBe(6 * 10 - 3);
  });

  it('when the temperature drifts steadily, then the equilibration flag is down', () => {
    const traj = withVelocities(50, 300, (f, _i, rng, out) => {
      for (let c = 0; c < 3; c++) out[c] = (1 + f / 300) * rng.normal();
    });
    expect(thermo(traj).equilibration.equilibrated).toBe(false);
  });

  // Where it settles: automated equilibration detection, Chodera, J. Chem. Theory Comput. 12, 1799 (2016).
  it('when the temperature starts three times too high and relaxes, then the flag is down and the run is said to settle after the transient', () => {
    // Speeds scale as 1 + 2·e^(−f/80): the excess temperature is over 50 % of T before frame 80 and below 2 % after 400.
    const traj = withVelocities(64, 800, (f, _i, rng, out) => {
      for (let c = 0; c < 3; c++) out[c] = (1 + 2 * Math.exp(-f / 80)) * rng.normal();
    }, 3);
    const r = thermo(traj);
    expect(r.equilibration.equilibrated).toBe(false);
    const settles = r.equilibration.settlesAfter!;
    expect(settles.frames).toBeGreaterThan(80);
    expect(settles.frames).toBeLessThan(560);
    expect(settles.ps).toBeCloseTo(settles.frames * 0.01, 12);
  });

  it('when the run is equilibrated, then no discard is suggested', () => {
    const traj = withVelocities(64, 400, (_f, _i, rng, out) => {
      for (let c = 0; c < 3; c++) out[c] = rng.normal();
    }, 4);
    const r = thermo(traj);
    expect(r.equilibration.equilibrated).toBe(true);
    expect(r.equilibration.settlesAfter).toBeNull();
  });

  it('when the cell is 20 Å of argon with 400 atoms, then density is 400·m_u/V in g/cm³', () => {
    const traj = { ...withVelocities(400, 2, (_f, _i, _r, out) => out.fill(0)), cells: cubicCells(2, 20) };
    const r = thermo(traj);
    expect(r.densityGPerCm3?.[0]).toBeCloseTo((400 * 39.95 * 1.6605390666e-24) / 8000e-24, 10);
    expect(r.numberDensityPerA3?.[0]).toBeCloseTo(0.05, 14);
  });
});

// SCIENCE item 18: Flyvbjerg & Petersen, J. Chem. Phys. 91, 461 (1989) [CONFIRMED].
describe('Block averaging (SCIENCE item 18)', () => {
  const n = 2 ** 18, phi = 0.9;
  const rng = new SeededRandom(18);
  const x = new Float64Array(n);
  let v = rng.normal();
  for (let i = 0; i < n; i++) x[i] = v = phi * v + Math.sqrt(1 - phi * phi) * rng.normal();
  const truth = Math.sqrt((1 + phi) / (1 - phi) / n);

  it('when an AR(1) series with φ = 0.9 is blocked, then the plateau is within 10 % of √(g/N) and level 0 is 0.23 ± 0.01 of it', () => {
    const r = blockAverage(x);
    expect(r.converged).toBe(true);
    expect(Math.abs(r.stdError / truth - 1)).toBeLessThan(0.1);
    expect(Math.abs(r.naiveStdError / truth - 0.229)).toBeLessThan(0.01);
    expect(r.inefficiency).toBeGreaterThan(15);
  });

  it('when samples are independent, then the blocking error equals the naive one within 10 %', () => {
    const white = Float64Array.from({ length: 2 ** 14 }, () => rng.normal());
    const r = blockAverage(white);
    expect(Math.abs(r.stdError / r.naiveStdError - 1)).toBeLessThan(0.1);
  });
});

// SCIENCE item 13: Arrhenius D = D0·exp(−Ea/RT); Holz, Heil & Sacco, PCCP 2, 4740 (2000): Speedy–Angell fit
// D0 = 1.635e-8 m²/s, Ts = 215.05 K, γ = 2.063 [CONFIRMED on a secondary page]; straight fit 15–35 °C
// gives Ea = 18.41 kJ/mol [DERIVED].
describe('Arrhenius fit (SCIENCE item 13)', () => {
  it('when D is generated exactly at 7 temperatures, then Ea and D0 come back to 1e-9', () => {
    const T = [250, 275, 300, 325, 350, 375, 400];
    const D = T.map((t) => 1e-6 * Math.exp(-18000 / (8.314462618 * t)));
    const r = arrhenius({ temperatureK: T, d: D });
    expect(Math.abs(r.activationEnergy.jPerMol / 18000 - 1)).toBeLessThan(1e-9);
    expect(Math.abs(r.d0 / 1e-6 - 1)).toBeLessThan(1e-9);
  });

  it('when the Holz water fit is sampled at 15–35 °C, then Ea = 18.4 ± 0.3 kJ/mol and the eV form is consistent', () => {
    const T = [15, 20, 25, 30, 35].map((c) => c + 273.15);
    const D = T.map((t) => 1.635e-8 * (t / 215.05 - 1) ** 2.063);
    const r = arrhenius({ temperatureK: T, d: D });
    expect(Math.abs(r.activationEnergy.kJPerMol - 18.4)).toBeLessThan(0.3);
    // 18.35 kJ/mol = 0.1902 eV per particle [DERIVED].
    expect(arrhenius({ temperatureK: [300, 400], d: [Math.exp(-18350 / (8.314462618 * 300)), Math.exp(-18350 / (8.314462618 * 400))] }).activationEnergy.eV).toBeCloseTo(0.1902, 4);
  });
});
