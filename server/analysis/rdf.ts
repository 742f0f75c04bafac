/**
 * Radial distribution functions g_ab(r) per species pair and in total, with
 * running coordination numbers and the first peak / first minimum.
 *
 * Normalisation (pinned by the tests): each frame's histogram is divided by
 * the ideal-gas count with that frame's volume, using exact shell volumes
 * (4π/3)(r₂³ − r₁³) and the density of *other* atoms — (N_a − 1)/V for a
 * like pair, N_b/V for unlike — so an ideal gas gives g = 1 exactly in
 * expectation and the coordination number N_ab(r) is the mean count of b
 * atoms within r of an a atom (an integer step function for a crystal).
 * Only distances strictly below r_max count (within single-precision
 * round-off of r_max counts as r_max); r_max may not exceed half the
 * shortest box edge (minimum image would double-count beyond it).
 */
import { cellFramesOf } from './cell-geometry.ts';
import { PairHistogram, type PairMethod } from './pair-histogram.ts';
import type { Trajectory } from './trajectory.ts';

export interface RdfOptions {
  rMaxA?: number;
  binWidthA?: number;
  /** Species pairs to report besides the total; default every pair present. */
  pairs?: readonly (readonly [string, string])[];
  frameStride?: number;
  method?: PairMethod;
}

export interface RdfFeature {
  rA: number;
  g: number;
  /** Coordination number at this radius. */
  coordination: number;
}

export interface RdfPairResult {
  label: string;
  a: string;
  b: string;
  g: Float64Array;
  /** Mean number of b within r of an a (at each bin's outer edge). */
  coordination: Float64Array;
  firstPeak: RdfFeature | null;
  firstMinimum: RdfFeature | null;
}

export interface RdfResult {
  units: { r: 'Å'; g: '1'; coordination: 'atoms' };
  /** Bin centres. */
  rA: Float64Array;
  binWidthA: number;
  rMaxA: number;
  framesUsed: number;
  method: 'cell-list' | 'brute-force';
  normalisation: 'ideal gas of the other atoms: (N_a−1)/V like pairs, N_b/V unlike, per-frame V';
  /** Mean number density N/V, atoms/Å³. */
  numberDensityPerA3: number;
  total: RdfPairResult;
  pairs: RdfPairResult[];
}

export const DEFAULT_RDF_BIN_WIDTH_A = 0.05;

export function rdf(traj: Trajectory, options: RdfOptions = {}, onProgress?: (fraction: number) => void): RdfResult {
  const geom = cellFramesOf(traj);
  if (!geom) throw new Error('g(r) needs a periodic cell for its ideal-gas normalisation.');
  if (!geom.orthorhombic) throw new Error('g(r) currently supports orthorhombic cells only; this trajectory has a triclinic cell.');
  const N = traj.nAtoms, T = traj.nFrames;
  let halfWidth = Infinity;
  for (let f = 0; f < T; f++) halfWidth = Math.min(halfWidth, 0.5 * geom.cells[9 * f], 0.5 * geom.cells[9 * f + 4], 0.5 * geom.cells[9 * f + 8]);
  const rMax = options.rMaxA ?? halfWidth;
  if (rMax > halfWidth * (1 + 1e-12)) {
    throw new Error(`r_max ${rMax} Å exceeds half the shortest box edge (${halfWidth.toFixed(4)} Å).`);
  }
  const binWidth = options.binWidthA ?? DEFAULT_RDF_BIN_WIDTH_A;
  const nBins = Math.max(1, Math.round(rMax / binWidth));
  const dr = rMax / nBins;

  const labels = [...new Set(traj.species)];
  const nT = labels.length;
  const types = Int32Array.from(traj.species, (s) => labels.indexOf(s));
  const counts = labels.map((l) => traj.species.filter((s) => s === l).length);
  const wanted = options.pairs ?? labels.flatMap((a, i) => labels.slice(i).map((b) => [a, b] as const));
  for (const [a, b] of wanted) {
    if (!labels.includes(a) || !labels.includes(b)) throw new Error(`Pair ${a}–${b} names a species not in this trajectory.`);
  }
  // Slot per unordered type pair; the total is the sum of all slots.
  const slotOf = (ta: number, tb: number): number => Math.min(ta, tb) * nT + Math.max(ta, tb);
  const pairSlot = new Int32Array(nT * nT);
  for (let a = 0; a < nT; a++) for (let b = 0; b < nT; b++) pairSlot[a * nT + b] = slotOf(a, b);
  const nSlots = nT * nT;
  const frameHist = new Float64Array(nSlots * nBins);
  const countSum = new Float64Array(nSlots * nBins);
  const gSum = new Float64Array(nSlots * nBins);
  const totalG = new Float64Array(nBins);
  const shell = Float64Array.from({ length: nBins }, (_, k) => ((4 * Math.PI) / 3) * (((k + 1) * dr) ** 3 - (k * dr) ** 3));
  const histogram = new PairHistogram(N, types, pairSlot, nT, nBins, rMax, options.method ?? 'auto');
  const stride = Math.max(1, Math.floor(options.frameStride ?? 1));
  let frames = 0, densitySum = 0;

  for (let f = 0; f < T; f += stride) {
    const o = 9 * f;
    frameHist.fill(0);
    histogram.addFrame(traj.positions, 3 * N * f, [geom.cells[o], geom.cells[o + 4], geom.cells[o + 8]], frameHist);
    const V = geom.volumes[f];
    densitySum += N / V;
    for (let a = 0; a < nT; a++) {
      for (let b = a; b < nT; b++) {
        const s = slotOf(a, b);
        const pairs = a === b ? (counts[a] * (counts[a] - 1)) / 2 : counts[a] * counts[b];
        if (pairs === 0) continue;
        for (let k = 0; k < nBins; k++) {
          const c = frameHist[s * nBins + k];
          countSum[s * nBins + k] += c;
          gSum[s * nBins + k] += (c * V) / (pairs * shell[k]);
        }
      }
    }
    const allPairs = (N * (N - 1)) / 2;
    for (let k = 0; k < nBins; k++) {
      let c = 0;
      for (let s = 0; s < nSlots; s++) c += frameHist[s * nBins + k];
      totalG[k] += (c * V) / (allPairs * shell[k]);
    }
    frames++;
    onProgress?.(Math.min(1, (f + 1) / T));
  }

  const rA = Float64Array.from({ length: nBins }, (_, k) => (k + 0.5) * dr);
  const build = (label: string, a: string, b: string, g: Float64Array, perAtomCounts: Float64Array): RdfPairResult => {
    const coordination = new Float64Array(nBins);
    let acc = 0;
    for (let k = 0; k < nBins; k++) coordination[k] = acc += perAtomCounts[k];
    const { peak, minimum } = firstFeatures(g);
    const feature = (k: number | null): RdfFeature | null => (k === null ? null : { rA: rA[k], g: g[k], coordination: coordination[k] });
    return { label, a, b, g, coordination, firstPeak: feature(peak), firstMinimum: feature(minimum) };
  };
  const totalCounts = new Float64Array(nBins);
  for (let s = 0; s < nSlots; s++) for (let k = 0; k < nBins; k++) totalCounts[k] += countSum[s * nBins + k];
  const total = build('all', '*', '*', totalG.map((v) => v / frames), totalCounts.map((c) => (2 * c) / (frames * N)));
  const pairs = wanted.map(([a, b]) => {
    const ta = labels.indexOf(a), tb = labels.indexOf(b);
    const s = slotOf(ta, tb);
    const g = gSum.slice(s * nBins, (s + 1) * nBins).map((v) => v / frames);
    // Each unordered like pair adds one neighbour to both atoms.
    const perA = countSum.slice(s * nBins, (s + 1) * nBins).map((c) => ((ta === tb ? 2 : 1) * c) / (frames * counts[ta]));
    return build(`${a}-${b}`, a, b, g, perA);
  });
  return {
    units: { r: 'Å', g: '1', coordination: 'atoms' },
    rA,
    binWidthA: dr,
    rMaxA: rMax,
    framesUsed: frames,
    method: histogram.lastMethod,
    normalisation: 'ideal gas of the other atoms: (N_a−1)/V like pairs, N_b/V unlike, per-frame V',
    numberDensityPerA3: densitySum / frames,
    total,
    pairs,
  };
}

/**
 * First peak: the highest point of the first excursion of g above 1.
 * First minimum: the lowest point after it, before g climbs back above 1.
 * Located on a three-bin running mean so single noisy bins do not win.
 */
function firstFeatures(g: Float64Array): { peak: number | null; minimum: number | null } {
  const n = g.length;
  const s = g.map((_, k) => (g[Math.max(0, k - 1)] + g[k] + g[Math.min(n - 1, k + 1)]) / 3);
  let k = 0;
  while (k < n && s[k] <= 1) k++;
  if (k >= n) return { peak: null, minimum: null };
  let peak = k;
  while (k < n && s[k] > 1) {
    if (s[k] > s[peak]) peak = k;
    k++;
  }
  if (k >= n) return { peak, minimum: null };
  let minimum = k;
  while (k < n && s[k] <= 1) {
    if (s[k] < s[minimum]) minimum = k;
    k++;
  }
  if (k >= n) return { peak, minimum: null };
  return { peak, minimum };
}
