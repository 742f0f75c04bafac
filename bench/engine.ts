/**
 * Engine benchmark: a 500-atom × 4000-frame trajectory with velocities,
 * synthesised in memory, through msd, vacf, vdos, rdf and thermo. Each stage
 * is compared with a naive reference in the same run where one exists and
 * with a numpy implementation of the same algorithm when python3 has numpy.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { lindemann } from '../server/analysis/lindemann.ts';
import { msd } from '../server/analysis/msd.ts';
import { fccLattice } from '../server/simulate/fcc-lattice.ts';
import { PairHistogram } from '../server/analysis/pair-histogram.ts';
import { rdf } from '../server/analysis/rdf.ts';
import { thermo } from '../server/analysis/thermo.ts';
import type { Trajectory } from '../server/analysis/trajectory.ts';
import { vacf } from '../server/analysis/vacf.ts';
import { vdos } from '../server/analysis/vdos.ts';
import { SeededRandom } from '../server/simulate/random.ts';
import type { BenchRow } from './bench-row.ts';
import { findReferencePython } from '../scripts/services/reference-python.ts';

const N = 500, T = 4000, DT = 0.01, BOX = 28.6, R_MAX = 9, BIN = 0.05;
/** Frames the O(N²) references actually run; their times are scaled to all frames. */
const REFERENCE_RDF_FRAMES = 200;
const REFERENCE_MSD_ATOMS = 5;

export async function benchEngine(): Promise<BenchRow[]> {
  const traj = synthesise();
  const rows: BenchRow[] = [];
  const time = <R>(f: () => R): [R, number] => {
    const t0 = performance.now();
    const r = f();
    return [r, (performance.now() - t0) / 1000];
  };

  const [, tMsd] = time(() => msd(traj));
  const [, tVacf] = time(() => vacf(traj));
  const [, tVdos] = time(() => vdos(traj));
  const [, tRdf] = time(() => rdf(traj, { rMaxA: R_MAX, binWidthA: BIN }));
  const [, tThermo] = time(() => thermo(traj));

  const tMsdNaive = naiveMsdSeconds(traj) * (N / REFERENCE_MSD_ATOMS);
  const tRdfNaive = bruteRdfSeconds(traj) * (T / REFERENCE_RDF_FRAMES);
  const numpy = numpyTimes(traj);
  const total = tMsd + tVacf + tVdos + tRdf + tThermo;
  const stage = (name: string, seconds: number, naive?: number, naiveLabel?: string): void => {
    rows.push({ name, seconds, reference: naiveLabel, ratio: naive ? seconds / naive : undefined, note: naive ? `naive ${naive.toFixed(2)} s (scaled)` : undefined });
    const np = numpy?.[name];
    if (np !== undefined) rows.push({ name: `${name} vs numpy`, seconds, reference: 'numpy, same algorithm', ratio: seconds / np, note: `numpy ${np.toFixed(3)} s` });
  };
  stage('msd', tMsd, tMsdNaive, `direct O(T²) MSD on ${REFERENCE_MSD_ATOMS} atoms, scaled`);
  stage('vacf', tVacf);
  stage('vdos', tVdos);
  stage('rdf', tRdf, tRdfNaive, `brute-force O(N²) pairs on ${REFERENCE_RDF_FRAMES} frames, scaled`);
  stage('thermo', tThermo);
  const npTotal = numpy ? Object.values(numpy).reduce((a, b) => a + b, 0) : undefined;
  rows.push({
    name: 'pipeline',
    seconds: total,
    reference: npTotal ? 'numpy pipeline (target ratio ≤ 0.5)' : undefined,
    ratio: npTotal ? total / npTotal : undefined,
    note: numpy ? `numpy ${npTotal?.toFixed(2)} s (its rdf timed on ${REFERENCE_RDF_FRAMES} frames, scaled)` : 'numpy not available: no comparison',
  });
  rows.push(lindemannScaling(time));
  // Memory is measured by the pipeline suite, in a process of its own, so
  // earlier suites in this run cannot inflate it.

  return rows;
}

/** Ornstein–Uhlenbeck-like motion wrapped in a cubic box: realistic array sizes and access patterns. */
function synthesise(): Trajectory {
  const rng = new SeededRandom(500);
  const positions = new Float32Array(3 * N * T), velocities = new Float32Array(3 * N * T);
  const a = Math.exp(-0.2), s = Math.sqrt(1 - a * a);
  for (let i = 0; i < N; i++)
    for (let c = 0; c < 3; c++) {
      let v = rng.normal(), x = rng.uniform() * BOX;
      for (let f = 0; f < T; f++) {
        if (f > 0) {
          v = a * v + s * rng.normal();
          x += v * DT;
        }
        const p = 3 * (N * f + i) + c;
        positions[p] = x - BOX * Math.floor(x / BOX);
        velocities[p] = v;
      }
    }
  const cells = new Float64Array(9 * T);
  for (let f = 0; f < T; f++) (cells[9 * f] = BOX), (cells[9 * f + 4] = BOX), (cells[9 * f + 8] = BOX);
  return { nAtoms: N, nFrames: T, species: new Array<string>(N).fill('Ar'), positions, velocities, cells, times: Float64Array.from({ length: T }, (_, f) => f * DT), boundary: 'periodic' };
}

function naiveMsdSeconds(traj: Trajectory): number {
  const nLags = Math.floor((T - 1) / 2) + 1;
  const x = new Float64Array(T);
  const out = new Float64Array(nLags);
  const t0 = performance.now();
  for (let i = 0; i < REFERENCE_MSD_ATOMS; i++)
    for (let c = 0; c < 3; c++) {
      x[0] = traj.positions[3 * i + c];
      for (let f = 1; f < T; f++) {
        let d = traj.positions[3 * (N * f + i) + c] - traj.positions[3 * (N * (f - 1) + i) + c];
        d -= BOX * Math.round(d / BOX);
        x[f] = x[f - 1] + d;
      }
      for (let m = 1; m < nLags; m++) {
        let sum = 0;
        for (let k = 0; k + m < T; k++) sum += (x[k + m] - x[k]) ** 2;
        out[m] += sum / (T - m);
      }
    }
  return (performance.now() - t0) / 1000;
}

function bruteRdfSeconds(traj: Trajectory): number {
  const nBins = Math.round(R_MAX / BIN);
  const hist = new Float64Array(nBins);
  const h = new PairHistogram(N, new Int32Array(N), Int32Array.from([0]), 1, nBins, R_MAX, 'brute-force');
  const t0 = performance.now();
  for (let f = 0; f < REFERENCE_RDF_FRAMES; f++) h.addFrame(traj.positions, 3 * N * f, [BOX, BOX, BOX], hist);
  return (performance.now() - t0) / 1000;
}

function numpyTimes(traj: Trajectory): Record<string, number> | null {
  const python = findReferencePython();
  if (!python) return null;
  const dir = mkdtempSync(join(tmpdir(), 'ergodic-bench-'));
  try {
    const file = join(dir, 'traj.f32');
    const v = traj.velocities as Float32Array;
    const both = new Float32Array(traj.positions.length + v.length);
    both.set(traj.positions);
    both.set(v, traj.positions.length);
    writeFileSync(file, both);
    const script = join(dirname(fileURLToPath(import.meta.url)), 'engine-numpy.py');
    const r = spawnSync(python, [script, file, String(N), String(T), String(DT), String(BOX), String(R_MAX), String(BIN), String(REFERENCE_RDF_FRAMES)], { encoding: 'utf8', maxBuffer: 1 << 20 });
    if (r.status !== 0) throw new Error(`numpy reference failed: ${r.stderr}`);
    return JSON.parse(r.stdout) as Record<string, number>;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/**
 * The bulk Lindemann index is O(N) per frame: time per atom at 4000 atoms
 * over time per atom at 864, same frames (target ratio ≈ 1; all pairs would give ≈ 4.6).
 */
export function lindemannScaling(time: <R>(f: () => R) => [R, number]): BenchRow {
  const crystal = (cells: number): Trajectory => {
    const sites = fccLattice(cells, 5.26), n = sites.length / 3, frames = 200, rng = new SeededRandom(cells);
    const positions = new Float32Array(3 * n * frames);
    for (let f = 0; f < frames; f++) for (let k = 0; k < 3 * n; k++) positions[3 * n * f + k] = sites[k] + 0.1 * rng.normal();
    const cells9 = new Float64Array(9 * frames);
    for (let f = 0; f < frames; f++) cells9[9 * f] = cells9[9 * f + 4] = cells9[9 * f + 8] = cells * 5.26;
    return { nAtoms: n, nFrames: frames, species: new Array<string>(n).fill('Ar'), positions, cells: cells9, times: Float64Array.from({ length: frames }, (_, f) => f * 0.01), boundary: 'periodic' };
  };
  const small = crystal(6), large = crystal(10);
  const [, tSmall] = time(() => lindemann(small));
  const [, tLarge] = time(() => lindemann(large));
  const ratio = tLarge / large.nAtoms / (tSmall / small.nAtoms);
  return { name: 'lindemann per atom, 4000 vs 864 atoms', seconds: tLarge, reference: 'same per-atom time at 864 atoms (O(N): ratio ≈ 1)', ratio, note: `${tSmall.toFixed(3)} s at 864 atoms, 200 frames` };
}
