/**
 * The nearest-neighbour distance r_nn as the first peak of the pair-distance
 * distribution divided by r² (the shape of g(r)), from a bounded sample of
 * atoms against all atoms in a few frames: O(N) per frame whatever the size.
 * For a jittered crystal the peak sits at the lattice spacing to O(s²/r_nn);
 * for a liquid it is the usual first-shell distance. The range searched is
 * 1.5× the median distance from a sampled atom to its closest neighbour,
 * which holds the first shell and needs no density (clusters have none).
 */
import { cellFramesOf, minimumImage } from './cell-geometry.ts';
import { FrameCursor } from './coordinate-blocks.ts';
import type { Trajectory } from './trajectory.ts';

export const SAMPLE_ATOMS = 96;
export const SAMPLE_FRAMES = 8;
const BINS = 240;
/** A first peak must reach this fraction of the highest one in range (a second shell can be higher, e.g. in diamond). */
const FIRST_PEAK_FRACTION = 0.5;

export function nearestNeighbourDistance(traj: Trajectory, atoms: Int32Array): number {
  if (atoms.length < 2) throw new Error('A nearest-neighbour distance needs at least two atoms.');
  // Two passes over the same sample, so no distance list is held: closest neighbours first, then the histogram.
  const closest: number[] = [];
  let min = Infinity;
  sampledDistances(traj, atoms, (r, last) => {
    if (r > 0 && r < min) min = r;
    if (last) {
      if (Number.isFinite(min)) closest.push(min);
      min = Infinity;
    }
  });
  if (closest.length === 0) throw new Error('All atoms sit on top of each other: no nearest-neighbour distance.');
  closest.sort((p, q) => p - q);
  const rCut = 1.5 * closest[Math.floor(closest.length / 2)];
  const binWidth = rCut / BINS;
  const hist = new Float64Array(BINS);
  sampledDistances(traj, atoms, (r) => {
    if (r > 0 && r < rCut) hist[Math.floor(r / binWidth)]++;
  });
  const shape = hist.map((c, k) => c / ((k + 0.5) * binWidth) ** 2);
  const smooth = shape.map((_, k) => (shape[Math.max(0, k - 1)] + 2 * shape[k] + shape[Math.min(BINS - 1, k + 1)]) / 4);
  let top = 0;
  for (const v of smooth) top = Math.max(top, v);
  let peak = smooth.indexOf(top);
  for (let k = 1; k < BINS - 1; k++) {
    if (smooth[k] >= FIRST_PEAK_FRACTION * top && smooth[k] >= smooth[k - 1] && smooth[k] >= smooth[k + 1]) {
      peak = k;
      break;
    }
  }
  // The centre of the peak's upper half: steadier than its highest bin against counting noise.
  let lo = peak, hi = peak;
  while (lo > 0 && shape[lo - 1] >= 0.5 * smooth[peak]) lo--;
  while (hi < BINS - 1 && shape[hi + 1] >= 0.5 * smooth[peak]) hi++;
  let weight = 0, moment = 0;
  for (let k = lo; k <= hi; k++) {
    weight += shape[k];
    moment += shape[k] * (k + 0.5);
  }
  return (moment / weight) * binWidth;
}

/** Calls back with every distance from a sampled atom to every other selected atom; `last` marks the end of one atom's row. */
function sampledDistances(traj: Trajectory, atoms: Int32Array, each: (r: number, last: boolean) => void): void {
  const geom = cellFramesOf(traj);
  const T = traj.nFrames, n = atoms.length;
  const cursor = new FrameCursor(traj, 'positions');
  const sampleStep = Math.max(1, Math.floor(n / SAMPLE_ATOMS));
  const frameStep = Math.max(1, Math.floor(T / SAMPLE_FRAMES));
  const d = new Float64Array(3);
  for (let f = 0; f < T; f += frameStep) {
    const { data: x, offset } = cursor.frame(f);
    for (let s = 0; s < n; s += sampleStep) {
      const i = atoms[s];
      const pi = offset + 3 * i;
      for (let k = 0; k < n; k++) {
        const j = atoms[k];
        if (j !== i) {
          const pj = offset + 3 * j;
          d[0] = x[pj] - x[pi];
          d[1] = x[pj + 1] - x[pi + 1];
          d[2] = x[pj + 2] - x[pi + 2];
          if (geom) minimumImage(geom, f, d);
          each(Math.sqrt(d[0] * d[0] + d[1] * d[1] + d[2] * d[2]), false);
        }
      }
      each(Infinity, true);
    }
  }
}

