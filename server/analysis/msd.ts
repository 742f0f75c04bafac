/**
 * Mean-squared displacement per species and over the selection, from
 * unwrapped positions, over all time origins (FFT algorithm), with Einstein
 * diffusion coefficients fitted on the diffusive window.
 */
import { AtomSeriesReader } from './atom-series.ts';
import { componentIndices, selectAtoms, type Components } from './atom-groups.ts';
import { fitDiffusion, type DiffusionFit } from './diffusion-fit.ts';
import { FftMsd } from './fft-msd.ts';
import { frameIntervalPs, lagCount } from './frame-timing.ts';
import type { Trajectory } from './trajectory.ts';

export interface MsdOptions {
  species?: readonly string[];
  /** Cartesian components (default "xyz"); d = their count enters D = slope/(2d). */
  components?: Components;
  /** Longest lag computed, ps (default half the run). */
  maxLagPs?: number;
  /** Manual fit window; automatic when absent. */
  fitWindowPs?: { startPs: number; endPs: number };
  /** Subtract the mass-weighted centre-of-mass motion (default true). */
  removeComDrift?: boolean;
  masses?: Readonly<Record<string, number>>;
  /** Only for demonstrating the wrap-around error of an unpadded FFT. */
  zeroPad?: boolean;
}

export interface MsdGroupResult {
  label: string;
  nAtoms: number;
  msdA2: Float64Array;
  diffusion: DiffusionFit;
}

export interface MsdResult {
  units: { lag: 'ps'; msd: 'Å²' };
  lagPs: Float64Array;
  dimensions: number;
  components: Components;
  unwrapped: boolean;
  comDriftRemoved: boolean;
  /** "all" first, then one per species. */
  groups: MsdGroupResult[];
}

/** Atom blocks for the uncertainty of D: atoms are dealt round-robin into this many blocks. */
export const DIFFUSION_BLOCKS = 8;
/** The automatic fit window ends at lag ≤ run length / this. */
export const AUTO_FIT_END_FRACTION_INVERSE = 4;

export function msd(traj: Trajectory, options: MsdOptions = {}, onProgress?: (fraction: number) => void): MsdResult {
  const dt = frameIntervalPs(traj);
  const T = traj.nFrames;
  const components = options.components ?? 'xyz';
  const dims = componentIndices(components);
  const sel = selectAtoms(traj, options.species, options.masses);
  const removeCom = options.removeComDrift ?? true;
  const reader = new AtomSeriesReader(traj, sel.masses, removeCom);
  const nLags = lagCount(T, dt, options.maxLagPs, 0.5);
  const lagPs = Float64Array.from({ length: nLags }, (_, m) => m * dt);
  const engine = new FftMsd(T, nLags, { zeroPad: options.zeroPad });
  const series = new Float64Array(3 * T);
  const perAtom = new Float64Array(nLags);

  const groupOf = new Map<number, number[]>();
  sel.groups.forEach((g, gi) => g.atoms.forEach((a) => groupOf.set(a, [...(groupOf.get(a) ?? []), gi])));
  const sums = sel.groups.map(() => new Float64Array(nLags));
  const blocks = sel.groups.map((g) => Array.from({ length: Math.min(DIFFUSION_BLOCKS, g.atoms.length) }, () => new Float64Array(nLags)));
  const blockCount = sel.groups.map(() => new Float64Array(DIFFUSION_BLOCKS));
  const seen = sel.groups.map(() => 0);

  sel.atoms.forEach((atom, k) => {
    reader.unwrapped(atom, series);
    perAtom.fill(0);
    for (const c of dims) engine.accumulate(series, c * T, perAtom);
    for (const gi of groupOf.get(atom) ?? []) {
      const sum = sums[gi];
      for (let m = 0; m < nLags; m++) sum[m] += perAtom[m];
      const nb = blocks[gi].length;
      const b = seen[gi]++ % nb;
      const block = blocks[gi][b];
      for (let m = 0; m < nLags; m++) block[m] += perAtom[m];
      blockCount[gi][b]++;
    }
    onProgress?.((k + 1) / sel.atoms.length);
  });

  // Origins thin out at long lags; a quarter of the run keeps ≥ 3/4 of them.
  const endIndex = Math.min(nLags - 1, Math.floor((T - 1) / AUTO_FIT_END_FRACTION_INVERSE));
  const groups = sel.groups.map((g, gi): MsdGroupResult => {
    const n = g.atoms.length;
    const curve = sums[gi].map((v) => v / n);
    const blockCurves = blocks[gi].map((b, bi) => b.map((v) => v / blockCount[gi][bi]));
    return {
      label: g.label,
      nAtoms: n,
      msdA2: curve,
      diffusion: fitDiffusion({ lagPs, msd: curve, blocks: blockCurves, dimensions: dims.length, endIndex, window: options.fitWindowPs }),
    };
  });
  return { units: { lag: 'ps', msd: 'Å²' }, lagPs, dimensions: dims.length, components, unwrapped: reader.unwraps, comDriftRemoved: removeCom, groups };
}
