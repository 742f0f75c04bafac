/**
 * One atom's series as the analyses read them: unwrapped positions and
 * stored velocities, the centre of mass removed. Each value must equal,
 * to the last bit, the textbook recipe written out plainly here: unwrap by
 * adding each frame-to-frame step reduced to the nearest image (the
 * minimum-image convention, Allen & Tildesley, Computer Simulation of
 * Liquids, §1.5 [FROM MEMORY]), then subtract the mass-weighted mean over
 * every atom, summed in atom order.
 */
import { describe, expect, it } from 'vitest';
import { AtomSeriesReader } from '../../../server/analysis/atom-series.ts';
import type { Trajectory } from '../../../server/analysis/trajectory.ts';
import { SeededRandom } from '../../../server/simulate/random.ts';
import { cubicCells, makeTrajectory } from './synthetic.ts';

const ATOMS = 37;
const FRAMES = 50;
const L = 10;

/** Atoms that jump up to 0.45 L per frame and are wrapped into the box, with velocities. */
function jumpy(periodic: boolean): Trajectory {
  const rng = new SeededRandom(11);
  const at = Array.from({ length: ATOMS }, () => [rng.uniform() * L, rng.uniform() * L, rng.uniform() * L]);
  const traj = makeTrajectory(ATOMS, FRAMES, 0.1, (f, i, out) => {
    for (let c = 0; c < 3; c++) {
      if (f > 0 && i === 0) for (const r of at) r[c] += (rng.uniform() - 0.5) * 0.9 * L;
      out[c] = periodic ? at[i][c] - L * Math.floor(at[i][c] / L) : at[i][c];
    }
  }, periodic ? { cells: cubicCells(FRAMES, L), boundary: 'periodic' } : {});
  const velocities = new Float32Array(traj.positions.length);
  for (let k = 0; k < velocities.length; k++) velocities[k] = rng.uniform() * 2 - 1;
  return { ...traj, velocities };
}

function masses(): Float64Array {
  return Float64Array.from({ length: ATOMS }, (_, i) => 1 + (i % 3) * 14.5);
}

/** Every atom's series, component-major, unwrapped step by step (or as stored). */
function plainSeries(traj: Trajectory, kind: 'positions' | 'velocities', periodic: boolean): Float64Array[] {
  const x = kind === 'positions' ? traj.positions : traj.velocities!;
  const T = traj.nFrames;
  return Array.from({ length: traj.nAtoms }, (_, a) => {
    const out = new Float64Array(3 * T);
    for (let c = 0; c < 3; c++) {
      out[c * T] = x[3 * a + c];
      for (let t = 1; t < T; t++) {
        let step = x[3 * (traj.nAtoms * t + a) + c] - x[3 * (traj.nAtoms * (t - 1) + a) + c];
        if (kind === 'positions' && periodic) step -= L * Math.round(step / L);
        out[c * T + t] = kind === 'positions' ? out[c * T + t - 1] + step : x[3 * (traj.nAtoms * t + a) + c];
      }
    }
    return out;
  });
}

function withoutCom(series: Float64Array[], m: Float64Array): Float64Array[] {
  let total = 0;
  for (const v of m) total += v;
  const com = new Float64Array(series[0].length);
  for (let k = 0; k < com.length; k++) {
    let s = 0;
    for (let a = 0; a < series.length; a++) s += m[a] * series[a][k];
    com[k] = s / total;
  }
  return series.map((one) => one.map((v, k) => v - com[k]));
}

describe('one atom series, the centre of mass removed', () => {
  for (const periodic of [true, false]) {
    const where = periodic ? 'in a periodic box, with steps that cross it' : 'without a box';
    const traj = jumpy(periodic);
    const m = masses();

    it(`${where}: the unwrapped positions equal the step-by-step unwrap minus the mass-weighted mean, to the last bit`, () => {
      const expected = withoutCom(plainSeries(traj, 'positions', periodic), m);
      const reader = new AtomSeriesReader(traj, m, true);
      for (let a = 0; a < ATOMS; a++) expect(reader.unwrapped(a, new Float64Array(3 * FRAMES))).toEqual(expected[a]);
    });

    it(`${where}: stored velocities equal the file's values minus the mass-weighted mean velocity, to the last bit`, () => {
      const expected = withoutCom(plainSeries(traj, 'velocities', periodic), m);
      const reader = new AtomSeriesReader(traj, m, true);
      const scratch = new Float64Array(3 * FRAMES);
      for (let a = 0; a < ATOMS; a++) expect(reader.velocities(a, new Float64Array(3 * FRAMES), 0.1, scratch)).toEqual(expected[a]);
    });

    it(`${where}: with drift removal off, the series are the plain unwrap and the stored values`, () => {
      const reader = new AtomSeriesReader(traj, m, false);
      const positions = plainSeries(traj, 'positions', periodic);
      const velocities = plainSeries(traj, 'velocities', periodic);
      const scratch = new Float64Array(3 * FRAMES);
      for (let a = 0; a < ATOMS; a++) {
        expect(reader.unwrapped(a, new Float64Array(3 * FRAMES))).toEqual(positions[a]);
        expect(reader.velocities(a, new Float64Array(3 * FRAMES), 0.1, scratch)).toEqual(velocities[a]);
      }
    });
  }
});
