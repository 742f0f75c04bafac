/**
 * Lindemann index, in the one form that fits the system (SCIENCE items 17, 23).
 *
 * Bulk (a periodic cell along any axis): the per-atom form
 *   δ_i = √⟨|u_i − ⟨u_i⟩|²⟩ / r_nn,  index δ_L = √(mean over atoms of ⟨|u − ⟨u⟩|²⟩) / r_nn,
 * on unwrapped positions with the centre-of-mass drift removed, r_nn the
 * first peak of the pair-distance distribution (nearest-neighbour.ts). It
 * does not depend on the number of atoms (√3·s/r_nn for isotropic jitter s)
 * and costs O(N) per frame. Averaging the pair form over all pairs of a bulk
 * system would dilute it with distant pairs and shrink it as the box grows.
 *
 * Finite cluster (no periodic axis): the pair form over all pairs,
 *   q_i = (1/(N−1)) Σ_{j≠i} √(⟨r_ij²⟩ − ⟨r_ij⟩²)/⟨r_ij⟩,  index = mean q_i
 * (definition as on the Wikipedia "Lindemann index" page [CONFIRMED]), which
 * is blind to the cluster's rotation; frames are strided to keep pairs ×
 * frames within budget.
 *
 * Melting thresholds, each applied to its own form: about 0.1 of the spacing
 * for the rms displacement in a bulk crystal (Lindemann, Phys. Z. 11, 609
 * (1910) [from memory]; "about one tenth" CONFIRMED in Buchenau, Zorn &
 * Ramos, arXiv:1311.4739), about 0.1 for the all-pairs index of a cluster
 * (Zhou, Karplus, Ball & Berry, J. Chem. Phys. 116, 2323 (2002) [from memory]).
 */
import { AtomSeriesReader } from './atom-series.ts';
import { selectAtoms } from './atom-groups.ts';
import { cellFramesOf } from './cell-geometry.ts';
import { nearestNeighbourDistance } from './nearest-neighbour.ts';
import { FrameCursor } from './coordinate-blocks.ts';
import type { Trajectory } from './trajectory.ts';

export const BULK_MELTING_THRESHOLD = 0.1;
export const CLUSTER_MELTING_THRESHOLD = 0.1;
/** Kept for callers that read one threshold. */
export const MELTING_THRESHOLD = BULK_MELTING_THRESHOLD;

export type LindemannForm = 'per-atom' | 'all-pairs';

export interface LindemannOptions {
  species?: readonly string[];
  masses?: Readonly<Record<string, number>>;
  /** Pair-distance evaluations allowed for the cluster form (pairs × frames). */
  budget?: number;
}

export interface LindemannResult {
  form: LindemannForm;
  /** δ_i (per-atom form) or q_i (all-pairs form) of each selected atom. */
  perAtom: Float64Array;
  atoms: Int32Array;
  index: number;
  threshold: number;
  melted: boolean;
  /** Pairs followed by the all-pairs form (0 for the per-atom form). */
  pairs: number;
  frameStride: number;
  framesUsed: number;
  /** √⟨|u − ⟨u⟩|²⟩ over the selected atoms, Å, COM drift removed. */
  rmsDisplacementA: number;
  nearestNeighbourA: number;
  /** rmsDisplacementA / nearestNeighbourA: the per-atom form, whichever form gives the index. */
  displacementRatio: number;
}

export function lindemann(traj: Trajectory, options: LindemannOptions = {}, onProgress?: (fraction: number) => void): LindemannResult {
  const sel = selectAtoms(traj, options.species, options.masses);
  const atoms = sel.atoms;
  const n = atoms.length;
  if (n < 2) throw new Error('The Lindemann index needs at least two atoms.');
  const rNN = nearestNeighbourDistance(traj, atoms);
  const displacement = perAtomDisplacement(traj, sel.masses, atoms, onProgress);
  const perAtomRatio = displacement.rmsPerAtom.map((u) => u / rNN);
  const ratio = displacement.rms / rNN;
  const cluster = cellFramesOf(traj) === null;
  if (!cluster) {
    return {
      form: 'per-atom', perAtom: perAtomRatio, atoms, index: ratio, threshold: BULK_MELTING_THRESHOLD, melted: ratio > BULK_MELTING_THRESHOLD,
      pairs: 0, frameStride: 1, framesUsed: traj.nFrames, rmsDisplacementA: displacement.rms, nearestNeighbourA: rNN, displacementRatio: ratio,
    };
  }
  const pairs = allPairsIndex(traj, atoms, options.budget ?? 4e8);
  return {
    form: 'all-pairs', perAtom: pairs.perAtom, atoms, index: pairs.index, threshold: CLUSTER_MELTING_THRESHOLD, melted: pairs.index > CLUSTER_MELTING_THRESHOLD,
    pairs: pairs.pairs, frameStride: pairs.stride, framesUsed: pairs.frames, rmsDisplacementA: displacement.rms, nearestNeighbourA: rNN, displacementRatio: ratio,
  };
}

/** Each atom's rms displacement about its mean unwrapped position, COM drift removed; O(N·T). */
function perAtomDisplacement(traj: Trajectory, masses: Float64Array, atoms: Int32Array, onProgress?: (fraction: number) => void): { rmsPerAtom: Float64Array; rms: number } {
  const reader = new AtomSeriesReader(traj, masses, true);
  const T = traj.nFrames;
  const series = new Float64Array(3 * T);
  const rmsPerAtom = new Float64Array(atoms.length);
  let sum = 0;
  atoms.forEach((atom, k) => {
    reader.unwrapped(atom, series);
    let msd = 0;
    for (let c = 0; c < 3; c++) {
      // Measured from the first frame, so an atom that never moves gives exactly 0.
      const origin = series[c * T];
      let mean = 0;
      for (let t = 0; t < T; t++) mean += series[c * T + t] - origin;
      mean /= T;
      for (let t = 0; t < T; t++) msd += (series[c * T + t] - origin - mean) ** 2;
    }
    // The mean position is itself estimated from the T frames: dividing by T − 1 removes that bias.
    msd /= Math.max(1, T - 1);
    rmsPerAtom[k] = Math.sqrt(msd);
    sum += msd;
    onProgress?.((k + 1) / atoms.length);
  });
  return { rmsPerAtom, rms: Math.sqrt(sum / atoms.length) };
}

/** The pair form over every pair of a finite cluster. */
function allPairsIndex(traj: Trajectory, atoms: Int32Array, budget: number): { perAtom: Float64Array; index: number; pairs: number; stride: number; frames: number } {
  const n = atoms.length, T = traj.nFrames;
  const cursor = new FrameCursor(traj, 'positions');
  const nPairs = (n * (n - 1)) / 2;
  const stride = Math.max(1, Math.ceil((nPairs * T) / budget));
  const sum = new Float64Array(nPairs), sum2 = new Float64Array(nPairs);
  let frames = 0;
  for (let f = 0; f < T; f += stride) {
    let p = 0;
    const { data: x, offset } = cursor.frame(f);
    for (let a = 0; a < n; a++) {
      const pa = offset + 3 * atoms[a];
      for (let b = a + 1; b < n; b++, p++) {
        const pb = offset + 3 * atoms[b];
        const r = Math.hypot(x[pb] - x[pa], x[pb + 1] - x[pa + 1], x[pb + 2] - x[pa + 2]);
        sum[p] += r;
        sum2[p] += r * r;
      }
    }
    frames++;
  }
  const qSum = new Float64Array(n);
  let p = 0;
  for (let a = 0; a < n; a++) {
    for (let b = a + 1; b < n; b++, p++) {
      const mean = sum[p] / frames;
      const q = Math.sqrt(Math.max(0, sum2[p] / frames - mean * mean)) / mean;
      qSum[a] += q;
      qSum[b] += q;
    }
  }
  const perAtom = qSum.map((q) => q / (n - 1));
  return { perAtom, index: perAtom.reduce((s, v) => s + v, 0) / n, pairs: nPairs, stride, frames };
}

