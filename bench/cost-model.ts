/**
 * The cost estimate against what the engine actually takes, in the same
 * run: each analysis alone on synthetic systems of two sizes, timed, beside
 * what server/run-plan/cost-estimate.ts predicts for them. A ratio far from
 * 1 means the prices in NS_PER_UNIT need measuring again on this hardware.
 */
import { runAnalyses } from '../server/analysis/index.ts';
import type { Trajectory } from '../server/analysis/trajectory.ts';
import { estimateCost } from '../server/run-plan/cost-estimate.ts';
import { SeededRandom } from '../server/simulate/random.ts';
import type { AnalysisKey } from '../shared/analysis-params.ts';
import type { BenchRow } from './bench-row.ts';

const KEYS: AnalysisKey[] = ['thermo', 'msd', 'vacf', 'rdf', 'lindemann', 'ngp'];

function liquid(n: number, frames: number, seed: number): Trajectory {
  const rng = new SeededRandom(seed);
  const box = Math.cbrt(n / 0.021);
  const dt = 0.01;
  const positions = new Float32Array(3 * n * frames), velocities = new Float32Array(3 * n * frames);
  const a = Math.exp(-0.2), s = Math.sqrt(1 - a * a);
  for (let i = 0; i < n; i++)
    for (let c = 0; c < 3; c++) {
      let v = rng.normal(), x = rng.uniform() * box;
      for (let f = 0; f < frames; f++) {
        if (f > 0) (v = a * v + s * rng.normal()), (x += v * dt);
        const p = 3 * (n * f + i) + c;
        positions[p] = x - box * Math.floor(x / box);
        velocities[p] = v;
      }
    }
  const cells = new Float64Array(9 * frames);
  for (let f = 0; f < frames; f++) (cells[9 * f] = box), (cells[9 * f + 4] = box), (cells[9 * f + 8] = box);
  return { nAtoms: n, nFrames: frames, species: new Array<string>(n).fill('Ar'), positions, velocities, cells, times: Float64Array.from({ length: frames }, (_, f) => f * dt), boundary: 'periodic' };
}

export async function benchCostModel(): Promise<BenchRow[]> {
  const rows: BenchRow[] = [];
  for (const [n, frames] of [[500, 2000], [4000, 300]] as const) {
    const traj = liquid(n, frames, n);
    const box = traj.cells![0]!;
    const input = { atoms: n, frames, hasVelocities: true, volumePerAtomA3: box ** 3 / n, rMaxA: null, halfWidthA: box / 2, cutoffA: null };
    for (const key of KEYS) {
      const t0 = performance.now();
      runAnalyses(traj, [key], {});
      const actual = (performance.now() - t0) / 1000;
      const predicted = estimateCost([key], input).analyses[0]!.seconds;
      rows.push({ name: `cost estimate: ${key}, ${n} atoms × ${frames} frames`, seconds: actual, reference: 'estimated time', ratio: predicted / actual, note: `estimated ${predicted.toFixed(3)} s` });
    }
  }
  return rows;
}
