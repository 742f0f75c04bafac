import { describe, expect, it } from 'vitest';
import { BOLTZMANN_ENGINE } from '../../../server/analysis/constants.ts';
import { seriesResults } from '../../../server/analysis/series/series-results.ts';
import type { Trajectory } from '../../../server/analysis/trajectory.ts';
import { fccLattice } from '../../../server/simulate/fcc-lattice.ts';
import { SeededRandom } from '../../../server/simulate/random.ts';
import { memberFromRun } from './series-fixtures.ts';

/**
 * A synthetic solid → liquid series with known answers: FCC crystals whose atoms jitter about
 * their sites (Lindemann ratio set by the jitter, SCIENCE item 23: δ = √3·s/r_nn), then the
 * same box of atoms random-walking with D(T) = D0·exp(−E_a/RT) (SCIENCE items 1 and 13).
 * Velocities are Maxwell–Boltzmann at the stated temperature so the measured T matches it.
 */
const R = 8.314462618;
const MASS = 39.948, A = 5.26, CELLS = 3, FRAMES = 400, DT = 0.1;
const L = A * CELLS, R_NN = A / Math.SQRT2;
const EA = 5000; // J/mol
const D0 = 0.05 * Math.exp(EA / (R * 80)); // Å²/ps, so that D(80 K) = 0.05

function box(temperatureK: number, seed: number, move: (site: Float64Array, atom: number, frame: number, rng: SeededRandom, out: Float64Array) => void): Trajectory {
  const sites = fccLattice(CELLS, A);
  const n = sites.length / 3;
  const rng = new SeededRandom(seed);
  const positions = new Float32Array(3 * n * FRAMES), velocities = new Float32Array(3 * n * FRAMES);
  const cells = new Float64Array(9 * FRAMES);
  const sd = Math.sqrt((BOLTZMANN_ENGINE * temperatureK) / MASS);
  const p = new Float64Array(3);
  for (let f = 0; f < FRAMES; f++) {
    cells[9 * f] = cells[9 * f + 4] = cells[9 * f + 8] = L;
    for (let i = 0; i < n; i++) {
      move(sites.subarray(3 * i, 3 * i + 3), i, f, rng, p);
      for (let c = 0; c < 3; c++) {
        positions[3 * (n * f + i) + c] = p[c] - L * Math.floor(p[c] / L);
        velocities[3 * (n * f + i) + c] = sd * rng.normal();
      }
    }
  }
  return { nAtoms: n, nFrames: FRAMES, species: new Array<string>(n).fill('Ar'), positions, velocities, cells, times: Float64Array.from({ length: FRAMES }, (_, f) => f * DT), boundary: 'periodic' };
}

function jitteredCrystal(temperatureK: number, lindemann: number, seed: number): Trajectory {
  const s = (lindemann * R_NN) / Math.sqrt(3);
  return box(temperatureK, seed, (site, _i, _f, rng, out) => {
    for (let c = 0; c < 3; c++) out[c] = site[c] + s * rng.normal();
  });
}

function diffusingAtoms(temperatureK: number, seed: number): Trajectory {
  const step = Math.sqrt(2 * D0 * Math.exp(-EA / (R * temperatureK)) * DT);
  const walkers = new Map<number, Float64Array>();
  return box(temperatureK, seed, (site, i, f, rng, out) => {
    let w = walkers.get(i);
    if (!w || f === 0) walkers.set(i, (w = Float64Array.from(site)));
    else for (let c = 0; c < 3; c++) w[c] += step * rng.normal();
    out.set(w);
  });
}

describe('a synthetic solid → liquid series through the engine', () => {
  const solids = [[20, 0.04], [40, 0.07], [60, 0.1]] as const;
  const liquids = [80, 100, 120, 140];
  const members = [
    ...solids.map(([t, l], i) => memberFromRun(i + 1, t, jitteredCrystal(t, l, 10 + i))),
    ...liquids.map((t, i) => memberFromRun(10 + i, t, diffusingAtoms(t, 20 + i))),
  ];
  const results = seriesResults(members);

  it('when jittered crystals sit below diffusing atoms, then the crystals are solid and the diffusing boxes liquid', () => {
    expect(results.members.map((m) => m.phase.phase)).toEqual(['solid', 'solid', 'solid', 'liquid', 'liquid', 'liquid', 'liquid']);
    // Lindemann ratio of the crystals is the one they were built with (SCIENCE item 23).
    for (const [i, [, l]] of solids.entries()) expect(results.members[i]!.lindemannRatio).toBeCloseTo(l, 2);
  });

  it('when melting is bracketed, then it falls between the 60 K crystal and the 80 K liquid', () => {
    expect(results.melting.brackets[0]).toMatchObject({ below: { trajectoryId: 3 }, above: { trajectoryId: 10 }, overlap: false });
    expect(results.melting.brackets[0]!.below!.temperatureK).toBeCloseTo(60, -1);
    expect(results.melting.brackets[0]!.above!.temperatureK).toBeCloseTo(80, -1);
  });

  it('when the liquids diffuse with a known E_a, then the Arrhenius fit recovers it within two standard errors, leaving the crystals out', () => {
    const fit = results.arrhenius;
    expect(fit.points.map((p) => p.trajectoryId)).toEqual([10, 11, 12, 13]);
    expect(fit.leftOut.map((l) => l.trajectoryId)).toEqual([1, 2, 3]);
    expect(fit.warnings).toEqual([]);
    const ea = fit.activationEnergy!.kJPerMol, error = fit.activationEnergyStdError!.kJPerMol;
    expect(Math.abs(ea - EA / 1e3)).toBeLessThan(2 * error);
    expect(error).toBeLessThan(0.1 * (EA / 1e3));
  });

  it('when the runs measure their own temperature, then the measured value is used and sits beside the stated one', () => {
    for (const m of results.members) {
      expect(m.temperatureSource).toBe('measured');
      expect(Math.abs(m.measuredTemperatureK!.mean - m.statedTemperatureK!)).toBeLessThan(0.03 * m.statedTemperatureK!);
    }
  });
});
