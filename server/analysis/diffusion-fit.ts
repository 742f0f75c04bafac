/**
 * Einstein diffusion from an MSD curve: D = slope / (2d) on the diffusive
 * window. The automatic window ends where origin statistics are still good
 * (lag ≤ a quarter of the run, or the user's max lag) and reaches back as far as the
 * local log–log slope stays within ±SLOPE_TOLERANCE of 1. A curve whose late
 * growth is small compared with its height is bounded (a solid, a trapped
 * particle): no D is reported for it, only the plateau.
 */
import { blockStandardError, MIN_BLOCKS } from './independent-blocks.ts';
import { fitLine } from './least-squares.ts';
import { diffusionUnits, type DiffusionUnits } from './units.ts';

export const SLOPE_TOLERANCE = 0.15;
/**
 * MSD growth across a window, relative to the growth a purely diffusive
 * (linear) MSD would show there, below which the motion counts as bounded.
 */
export const BOUNDED_GROWTH_RATIO = 0.3;

export type MotionRegime = 'diffusive' | 'subdiffusive' | 'superdiffusive' | 'bounded' | 'too-short';

export interface DiffusionFit {
  regime: MotionRegime;
  window: { startPs: number; endPs: number; source: 'auto' | 'manual' };
  /** D with its standard error, or null when the motion is bounded / too short (auto window). */
  d: DiffusionUnits | null;
  dStdError: DiffusionUnits | null;
  /** How dStdError was found: independent atom groups or stretches of time origins; none when neither is possible. */
  uncertaintyMethod: 'atom-blocks' | 'time-blocks' | 'none';
  /** Independent blocks behind dStdError. */
  uncertaintyBlocks: number;
  /** Log–log slope of the MSD over the window (1 diffusive, 2 ballistic, 0 bounded). */
  slopeExponent: number;
  /** Mean MSD over the late window when bounded, Å². */
  plateauA2: number | null;
}

export interface FitRequest {
  lagPs: Float64Array;
  msd: Float64Array;
  /** Independent atom blocks' MSDs for the uncertainty (fewer than MIN_BLOCKS: none). */
  blocks: Float64Array[];
  dimensions: number;
  /** Last lag index the automatic window may use. */
  endIndex: number;
  window?: { startPs: number; endPs: number };
}

export function fitDiffusion(req: FitRequest): DiffusionFit {
  const { lagPs, msd, dimensions } = req;
  const end = Math.min(req.endIndex, msd.length - 1);
  const empty = (regime: MotionRegime): DiffusionFit => ({
    regime,
    window: { startPs: 0, endPs: lagPs[Math.max(0, end)] ?? 0, source: req.window ? 'manual' : 'auto' },
    d: null,
    dStdError: null,
    uncertaintyMethod: 'none',
    uncertaintyBlocks: 0,
    slopeExponent: NaN,
    plateauA2: null,
  });
  if (req.window) {
    const dt = lagPs[1] - lagPs[0];
    const i0 = Math.max(1, Math.round(req.window.startPs / dt));
    const i1 = Math.min(msd.length - 1, Math.round(req.window.endPs / dt));
    if (i1 - i0 < 2) throw new Error('The fit window must span at least three lags inside the computed MSD.');
    const regime = classify(lagPs, msd, i0, i1);
    return finish(req, i0, i1, regime, 'manual', regime === 'bounded');
  }
  if (end < 4) return empty('too-short');
  const half = Math.max(1, Math.floor(end / 2));
  if (growthRatio(lagPs, msd, half, end) < BOUNDED_GROWTH_RATIO) {
    return { ...finish(req, half, end, 'bounded', 'auto', true), d: null, dStdError: null, uncertaintyMethod: 'none', uncertaintyBlocks: 0 };
  }
  const grid = logGrid(end);
  const beta = (j: number): number => {
    const a = grid[Math.max(0, j - 2)], b = grid[Math.min(grid.length - 1, j + 2)];
    return Math.log(Math.max(msd[b], 1e-300) / Math.max(msd[a], 1e-300)) / Math.log(b / a);
  };
  let j = grid.length - 1;
  while (j > 0 && Math.abs(beta(j) - 1) <= SLOPE_TOLERANCE) j--;
  if (j === grid.length - 1) {
    const late = beta(grid.length - 1);
    return finish(req, half, end, late < 1 ? 'subdiffusive' : 'superdiffusive', 'auto', false);
  }
  const start = Math.min(grid[j + 1], end - 2);
  return finish(req, Math.max(1, start), end, 'diffusive', 'auto', false);
}

function finish(req: FitRequest, i0: number, i1: number, regime: MotionRegime, source: 'auto' | 'manual', bounded: boolean): DiffusionFit {
  const { lagPs, msd, dimensions, blocks } = req;
  const dValue = diffusionOverWindow(lagPs, msd, i0, i1, dimensions);
  const useBlocks = blocks.length >= MIN_BLOCKS;
  const se = useBlocks ? blockStandardError(blocks.map((b) => diffusionOverWindow(lagPs, b, i0, i1, dimensions))) : NaN;
  let plateau = 0;
  for (let i = i0; i <= i1; i++) plateau += msd[i];
  plateau /= i1 - i0 + 1;
  return {
    regime,
    window: { startPs: lagPs[i0], endPs: lagPs[i1], source },
    d: diffusionUnits(dValue),
    dStdError: useBlocks ? diffusionUnits(se) : null,
    uncertaintyMethod: useBlocks ? 'atom-blocks' : 'none',
    uncertaintyBlocks: useBlocks ? blocks.length : 0,
    slopeExponent: logLogSlope(lagPs, msd, i0, i1),
    plateauA2: bounded ? plateau : null,
  };
}

/** D = slope/(2d) of a least-squares line through the MSD over lags i0..i1. */
export function diffusionOverWindow(lagPs: ArrayLike<number>, msd: ArrayLike<number>, i0: number, i1: number, dimensions: number): number {
  return fitLine(lagPs, msd, i0, i1).slope / (2 * dimensions);
}

function classify(lagPs: Float64Array, msd: Float64Array, i0: number, i1: number): MotionRegime {
  if (growthRatio(lagPs, msd, i0, i1) < BOUNDED_GROWTH_RATIO) return 'bounded';
  const b = logLogSlope(lagPs, msd, i0, i1);
  if (Math.abs(b - 1) <= SLOPE_TOLERANCE) return 'diffusive';
  return b < 1 ? 'subdiffusive' : 'superdiffusive';
}

/**
 * Rise of the fitted line across [i0, i1] relative to the mean MSD there,
 * divided by the same ratio for MSD ∝ t (1 diffusive, ≈0 bounded).
 */
function growthRatio(lagPs: Float64Array, msd: Float64Array, i0: number, i1: number): number {
  const fit = fitLine(lagPs, msd, i0, i1);
  let mean = 0;
  for (let i = i0; i <= i1; i++) mean += msd[i];
  mean /= i1 - i0 + 1;
  if (!(mean > 0)) return 0;
  const a = lagPs[i0], b = lagPs[i1];
  return (fit.slope * (b - a)) / mean / ((2 * (b - a)) / (a + b));
}

function logLogSlope(lagPs: Float64Array, msd: Float64Array, i0: number, i1: number): number {
  const lo = Math.max(1, i0);
  const n = i1 - lo + 1;
  if (n < 2) return NaN;
  const x = new Float64Array(n), y = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    x[i] = Math.log(lagPs[lo + i]);
    y[i] = Math.log(Math.max(msd[lo + i], 1e-300));
  }
  return fitLine(x, y).slope;
}

/** Lag indices spaced about 20 per decade from 1 to end. */
function logGrid(end: number): number[] {
  const out: number[] = [];
  for (let k = 0; ; k++) {
    const v = Math.round(10 ** (k / 20));
    if (v > end) break;
    if (out.length === 0 || v !== out[out.length - 1]) out.push(v);
  }
  if (out[out.length - 1] !== end) out.push(end);
  return out;
}
