/**
 * Energy analysis benchmark: 10 000 argon-like atoms × 1 000 frames (a jittered
 * FCC liquid-density packing, LJ σ = 3.405 Å, ε = 0.0103236 eV, r_c = 10.5 Å),
 * the whole `energy` analysis against a numpy/scipy peer that finds pairs with
 * cKDTree and sums with numpy, in the same run. The peer is timed on the first
 * PEER_FRAMES frames and scaled to all of them; its mean pair energy on those
 * frames must match ours. Without numpy/scipy the comparison is skipped, saying so.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { interactionModelSchema } from '../shared/interaction-model.ts';
import { energy } from '../server/analysis/energy.ts';
import type { Trajectory } from '../server/analysis/trajectory.ts';
import { fccLattice } from '../server/simulate/fcc-lattice.ts';
import { SeededRandom } from '../server/simulate/random.ts';
import type { BenchRow } from './bench-row.ts';
import { findReferencePython } from '../scripts/services/reference-python.ts';

const N = 10_000, FRAMES = 1_000, PEER_FRAMES = 100, CELLS = 14, SIGMA = 3.405, EPS_EV = 0.0103236, RC = 10.5;
/** Liquid-argon number density, atoms/Å³ (≈ 1.4 g/cm³). */
const DENSITY = 0.0211;

export async function benchEnergy(): Promise<BenchRow[]> {
  const { traj, box } = synthesise();
  const model = interactionModelSchema.parse({ pairs: [{ species: ['Ar', 'Ar'], form: 'lj', epsilonEV: EPS_EV, sigmaA: SIGMA, cutoffA: RC }] });
  const t0 = performance.now();
  const result = energy(traj, { model, ensemble: 'NVE' });
  const seconds = (performance.now() - t0) / 1000;
  const ours = result.potentialPerAtomEV!;
  let oursPeerMean = 0;
  for (let f = 0; f < PEER_FRAMES; f++) oursPeerMean += ours[f] * N;
  oursPeerMean /= PEER_FRAMES;
  const rows: BenchRow[] = [{ name: `energy ${N} atoms × ${FRAMES} frames`, seconds, note: `${(seconds / FRAMES * 1000).toFixed(1)} ms/frame, cell lists` }];
  const peer = scipyPeer(traj, box);
  if (!peer) {
    rows.push({ name: 'energy vs numpy/scipy', seconds, note: 'SKIPPED: python3 with numpy and scipy is not available, no comparison' });
    return rows;
  }
  const peerSeconds = (peer.seconds * FRAMES) / peer.frames;
  const agreement = Math.abs(peer.meanPairEV / oursPeerMean - 1);
  rows.push({
    name: 'energy vs numpy/scipy (cKDTree)', seconds, reference: 'numpy/scipy cKDTree peer (target ratio ≤ 0.5)', ratio: seconds / peerSeconds,
    note: `peer ${peerSeconds.toFixed(1)} s (timed on ${peer.frames} frames, scaled); mean pair energy ${oursPeerMean.toFixed(6)} eV here, ${peer.meanPairEV.toFixed(6)} eV there`,
  });
  if (!(agreement < 1e-6)) throw new Error(`energy bench: our mean pair energy ${oursPeerMean} eV differs from the scipy peer's ${peer.meanPairEV} eV`);
  return rows;
}

function synthesise(): { traj: Trajectory; box: number } {
  const sites = fccLattice(CELLS, 1);
  const box = Math.cbrt((4 * CELLS ** 3) / DENSITY);
  const a = box / CELLS;
  const rng = new SeededRandom(2024);
  const positions = new Float32Array(3 * N * FRAMES), velocities = new Float32Array(3 * N * FRAMES);
  for (let f = 0; f < FRAMES; f++) {
    const base = 3 * N * f;
    for (let k = 0; k < 3 * N; k++) {
      positions[base + k] = sites[k] * a + 0.25 * rng.normal();
      velocities[base + k] = 1.4 * rng.normal();
    }
  }
  const cells = new Float64Array(9 * FRAMES);
  for (let f = 0; f < FRAMES; f++) (cells[9 * f] = box), (cells[9 * f + 4] = box), (cells[9 * f + 8] = box);
  const traj: Trajectory = {
    nAtoms: N, nFrames: FRAMES, species: new Array<string>(N).fill('Ar'), positions, velocities, cells,
    times: Float64Array.from({ length: FRAMES }, (_, f) => f * 0.01), boundary: 'periodic',
  };
  return { traj, box };
}

function scipyPeer(traj: Trajectory, box: number): { seconds: number; frames: number; meanPairEV: number } | null {
  const python = findReferencePython();
  if (!python) return null;
  const dir = mkdtempSync(join(tmpdir(), 'ergodic-bench-energy-'));
  try {
    const file = join(dir, 'positions.f32');
    writeFileSync(file, traj.positions.subarray(0, 3 * N * PEER_FRAMES));
    const script = join(dirname(fileURLToPath(import.meta.url)), 'energy-scipy.py');
    const r = spawnSync(python, [script, file, String(N), String(PEER_FRAMES), String(box), String(RC), String(SIGMA), String(EPS_EV)], { encoding: 'utf8', maxBuffer: 1 << 20 });
    if (r.status !== 0) throw new Error(`scipy peer failed: ${r.stderr}`);
    return JSON.parse(r.stdout) as { seconds: number; frames: number; meanPairEV: number };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
