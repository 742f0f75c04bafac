/**
 * Where g(r) has a first coordination shell, judged against the histogram's
 * own counting error, so that noise is never reported as structure.
 *
 * Counts are first scaled to independent configurations: of F frames only
 * F_eff are independent at the scale of the bins (atoms that barely move
 * between frames show the same pairs again), so a count c weighs as
 * c·F_eff/F. On a three-bin running mean:
 *  - a peak must hold at least MIN_COUNTS such pairs ("too few counts"
 *    otherwise) and stand Z errors above 1, the error being the Poisson error
 *    an ideal gas would have there, 1/√(c_ideal), or the spread of g between
 *    consecutive blocks of frames over √B if larger;
 *  - rises and falls between bins must exceed Z times their combined errors,
 *    each √max(c, c_ideal, 1)/c_ideal (or the block spread if larger).
 *
 * First peak: from the first such bin, the highest point before g falls
 * clearly below it; no fall inside r_max, no separated shell. First minimum:
 * the lowest point after the peak before g rises clearly again (a liquid's
 * dip, a crystal's empty gap); if g never dips clearly below 1, the shell
 * ends where g is back at 1 within its error (a bonded pair in a dilute gas).
 */

/** Errors a peak must stand above 1, and a dip or rise must span. */
export const SHELL_SIGNIFICANCE = 5;
/** Independent pairs a bin (three-bin sum) must hold before its height counts as a peak. */
export const MIN_COUNTS = 5;

export interface ShellInput {
  /** g(r) per bin, averaged over frames. */
  g: ArrayLike<number>;
  /** Pair counts per bin, summed over frames. */
  counts: ArrayLike<number>;
  /** Ideal-gas pair counts per bin, summed over frames. */
  ideal: ArrayLike<number>;
  /** g(r) of consecutive blocks of frames (fewer than 4: not used). */
  blocks: readonly ArrayLike<number>[];
  /** Frames counted, and how many of them are independent configurations at the scale of three bins. */
  frames: number;
  independentFrames: number;
}

export interface Shell {
  peak: number | null;
  minimum: number | null;
}

export function firstShell(input: ShellInput): Shell {
  const n = input.g.length;
  const smooth = (v: ArrayLike<number>, k: number, sum = false): number => {
    const a = Math.max(0, k - 1), b = Math.min(n - 1, k + 1);
    let s = 0;
    for (let i = a; i <= b; i++) s += v[i];
    return sum ? s : s / (b - a + 1);
  };
  const weight = Math.max(1, Math.min(input.frames, input.independentFrames)) / input.frames;
  const g = Float64Array.from({ length: n }, (_, k) => smooth(input.g, k));
  const counts = Float64Array.from({ length: n }, (_, k) => smooth(input.counts, k, true) * weight);
  const ideal = Float64Array.from({ length: n }, (_, k) => smooth(input.ideal, k, true) * weight);
  const spread = Float64Array.from({ length: n }, (_, k) => {
    const B = input.blocks.length;
    if (B < 4) return 0;
    const values = input.blocks.map((b) => smooth(b, k));
    const mean = values.reduce((s, v) => s + v, 0) / B;
    return Math.sqrt(values.reduce((s, v) => s + (v - mean) ** 2, 0) / (B - 1) / B);
  });
  const nullError = (k: number): number => Math.max(ideal[k] > 0 ? 1 / Math.sqrt(ideal[k]) : Infinity, spread[k]);
  const error = (k: number): number => Math.max(ideal[k] > 0 ? Math.sqrt(Math.max(counts[k], ideal[k], 1)) / ideal[k] : Infinity, spread[k]);
  const Z = SHELL_SIGNIFICANCE;
  const apart = (i: number, j: number): number => Z * Math.hypot(error(i), error(j));

  let start = -1;
  for (let k = 0; k < n && start < 0; k++) if (counts[k] >= MIN_COUNTS && g[k] - 1 > Z * nullError(k)) start = k;
  if (start < 0) return { peak: null, minimum: null };
  let peak = start, fell = false;
  for (let k = start + 1; k < n; k++) {
    if (g[k] > g[peak]) peak = k;
    else if (g[k] < g[peak] - apart(k, peak)) {
      fell = true;
      break;
    }
  }
  if (!fell) return { peak: null, minimum: null };

  let low = peak + 1;
  for (let k = peak + 1; k < n; k++) {
    if (g[k] < g[low]) low = k;
    else if (g[k] > g[low] + apart(k, low)) return { peak, minimum: low };
  }
  // No rise again: a shell that ends by falling back to the ideal-gas level, if it never dipped clearly below it.
  if (g[low] >= 1 - Z * error(low)) {
    for (let k = peak + 1; k < n; k++) if (g[k] <= 1 + Z * error(k)) return { peak, minimum: k };
  }
  return { peak, minimum: null };
}

/**
 * How many of F frames are independent at a length scale w: with a typical
 * displacement δ between consecutive frames, configurations renew after
 * about (w/δ)² frames of diffusive motion; at least one, at most F.
 */
export function independentFrames(frames: number, stepRmsA: number, scaleA: number): number {
  if (!(stepRmsA > 0)) return 1;
  const renewal = Math.max(1, (scaleA / stepRmsA) ** 2);
  return Math.max(1, Math.min(frames, frames / renewal));
}
