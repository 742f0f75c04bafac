import { BOLTZMANN_ENGINE } from '../../server/analysis/constants.ts';
import { writeExtxyz } from '../../server/formats/write-extxyz.ts';
import type { Frame } from '../../server/formats/frame.ts';
import { fccLattice } from '../../server/simulate/fcc-lattice.ts';
import { SeededRandom } from '../../server/simulate/random.ts';

export interface StatePointOptions {
  temperatureK: number;
  /** Crystal: atoms jitter about FCC sites with this Lindemann ratio; liquid: they random-walk with `dA2PerPs`. */
  kind: 'crystal' | 'liquid';
  lindemann?: number;
  dA2PerPs?: number;
  seed: number;
  frames?: number;
}

const MASS = 39.948, A = 5.26, CELLS = 3, DT = 0.1;
const L = A * CELLS, R_NN = A / Math.SQRT2;

/**
 * An argon-like state point with known answers, as extended XYZ with
 * velocities: a jittered FCC crystal (Lindemann ratio √3·s/r_nn = the value
 * asked for, SCIENCE item 23) or random walkers with MSD = 6·D·t (Einstein
 * relation), velocities Maxwell–Boltzmann at the stated temperature so the
 * measured kinetic temperature matches it.
 */
export async function statePointExtxyz(o: StatePointOptions): Promise<Buffer> {
  const frames = o.frames ?? 300;
  const sites = fccLattice(CELLS, A);
  const n = sites.length / 3;
  const rng = new SeededRandom(o.seed);
  const sd = Math.sqrt((BOLTZMANN_ENGINE * o.temperatureK) / MASS);
  const jitter = ((o.lindemann ?? 0.05) * R_NN) / Math.sqrt(3);
  const step = Math.sqrt(2 * (o.dA2PerPs ?? 0) * DT);
  const walkers = Float64Array.from(sites);
  const cell = Float64Array.from([L, 0, 0, 0, L, 0, 0, 0, L]);
  const species = new Array<string>(n).fill('Ar');
  function* all(): Generator<Frame> {
    for (let f = 0; f < frames; f++) {
      const positions = new Float64Array(3 * n), velocities = new Float64Array(3 * n);
      for (let k = 0; k < 3 * n; k++) {
        let p: number;
        if (o.kind === 'crystal') p = sites[k]! + jitter * rng.normal();
        else p = f === 0 ? walkers[k]! : (walkers[k]! += step * rng.normal());
        positions[k] = p - L * Math.floor(p / L);
        velocities[k] = sd * rng.normal();
      }
      yield { index: f, positions, velocities, species, cell, pbc: [true, true, true], time: f * DT };
    }
  }
  const chunks: Uint8Array[] = [];
  for await (const chunk of writeExtxyz(all())) chunks.push(chunk);
  return Buffer.concat(chunks);
}
