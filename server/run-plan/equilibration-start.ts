/**
 * Where a run stops equilibrating, judged from one per-frame series (the
 * kinetic energy, a file's energy, the cell volume): the automated
 * equilibration detection of Chodera, J. Chem. Theory Comput. 12, 1799
 * (2016). For each candidate start t0 the statistical inefficiency g of the
 * series from t0 on is estimated, and the start that keeps the most
 * effectively independent samples, (T − t0)/g, wins: an early transient
 * inflates g, so dropping it pays, while dropping equilibrated data does not.
 *
 * g = 1 + 2 Σ_{t≥1} (1 − t/N) C(t), with the normalised autocorrelation C
 * summed until it first drops to zero, as in the pymbar reference code
 * (common practice, from memory). Long series are averaged in blocks first
 * (at most MAX_POINTS points), which keeps the trend the method looks for.
 */
import { Autocorrelator } from '../analysis/fft.ts';

const MAX_POINTS = 4096;
const CANDIDATES = 100;

export interface EquilibrationStart {
  /** First frame judged equilibrated (0 when the whole series is). */
  frame: number;
  /** Statistical inefficiency of the series from that frame on (in frames). */
  inefficiency: number;
  /** Effectively independent samples kept. */
  effectiveSamples: number;
}

/** Statistical inefficiency of x[from..], in samples of x. */
export function statisticalInefficiency(x: Float64Array, from = 0): number {
  const n = x.length - from;
  if (n < 3) return 1;
  let mean = 0;
  for (let i = from; i < x.length; i++) mean += x[i]!;
  mean /= n;
  const centred = new Float64Array(n);
  let variance = 0;
  for (let i = 0; i < n; i++) {
    const v = x[from + i]! - mean;
    centred[i] = v;
    variance += v * v;
  }
  if (!(variance > 0)) return 1;
  const sums = new Autocorrelator(n).correlate(centred, new Float64Array(n));
  let g = 1;
  for (let t = 1; t < n - 1; t++) {
    // Lag sums divided by their own pair counts, relative to the lag-0 variance.
    const c = (sums[t]! / (n - t)) / (variance / n);
    if (c <= 0 && t > 3) break;
    g += 2 * c * (1 - t / n);
  }
  return Math.max(1, g);
}

/** The equilibration start of a per-frame series, or null when it is too short to judge (fewer than 20 frames). */
export function equilibrationStart(series: Float64Array): EquilibrationStart | null {
  const frames = series.length;
  if (frames < 20) return null;
  const block = Math.max(1, Math.ceil(frames / MAX_POINTS));
  const points = Math.floor(frames / block);
  const x = new Float64Array(points);
  for (let p = 0; p < points; p++) {
    let s = 0;
    for (let k = 0; k < block; k++) s += series[p * block + k]!;
    x[p] = s / block;
  }
  let best: EquilibrationStart = { frame: 0, inefficiency: 1, effectiveSamples: -1 };
  const last = Math.floor(points / 2);
  const step = Math.max(1, Math.floor(last / CANDIDATES));
  for (let t0 = 0; t0 <= last; t0 += step) {
    const g = statisticalInefficiency(x, t0);
    const effective = (points - t0) / g;
    if (effective > best.effectiveSamples) best = { frame: t0 * block, inefficiency: g * block, effectiveSamples: effective };
  }
  return best;
}
