/**
 * Peaks of a sampled non-negative spectrum: local maxima above a fraction of
 * the largest value that also stand out from their surroundings (topographic
 * prominence, so ripples on a broad band are not listed as lines), centred by a parabola through the logarithm of the three
 * top samples (exact for a Gaussian line), widths at half maximum by linear
 * interpolation between samples.
 */
export interface Peak {
  position: number;
  height: number;
  /** Full width at half maximum in the x unit; NaN if a side never drops to half. */
  fwhm: number;
}

export function findPeaks(
  x: ArrayLike<number>, y: ArrayLike<number>, options: { minRelativeHeight?: number; minRelativeProminence?: number; maxPeaks?: number } = {},
): Peak[] {
  const n = y.length;
  const minRel = options.minRelativeHeight ?? 0.05;
  const minProminence = options.minRelativeProminence ?? 0.1;
  let top = 0;
  for (let i = 0; i < n; i++) top = Math.max(top, y[i]);
  if (!(top > 0)) return [];
  const peaks: Peak[] = [];
  for (let k = 1; k < n - 1; k++) {
    if (!(y[k] > y[k - 1] && y[k] >= y[k + 1] && y[k] >= minRel * top)) continue;
    if (prominence(y, k) < minProminence * top) continue;
    const dx = x[k + 1] - x[k];
    let offset = 0;
    let height = y[k];
    if (y[k - 1] > 0 && y[k + 1] > 0) {
      const a = Math.log(y[k - 1]), b = Math.log(y[k]), c = Math.log(y[k + 1]);
      const denom = a - 2 * b + c;
      if (denom < 0) {
        offset = (0.5 * (a - c)) / denom;
        height = Math.exp(b - 0.25 * (a - c) * offset);
      }
    }
    const half = height / 2;
    const left = crossing(x, y, k, -1, half);
    const right = crossing(x, y, k, 1, half);
    peaks.push({ position: x[k] + offset * dx, height, fwhm: right - left });
  }
  peaks.sort((p, q) => q.height - p.height);
  return peaks.slice(0, options.maxPeaks ?? 20);
}

/** How far a peak rises above the higher of the lowest points separating it from higher ground on each side. */
function prominence(y: ArrayLike<number>, k: number): number {
  const base = (dir: -1 | 1): number => {
    let low = y[k];
    for (let i = k + dir; i >= 0 && i < y.length; i += dir) {
      if (y[i] > y[k]) return low;
      low = Math.min(low, y[i]);
    }
    return low;
  };
  return y[k] - Math.max(base(-1), base(1));
}

function crossing(x: ArrayLike<number>, y: ArrayLike<number>, k: number, dir: -1 | 1, level: number): number {
  for (let i = k; i + dir >= 0 && i + dir < y.length; i += dir) {
    const j = i + dir;
    if (y[j] <= level) {
      const f = (y[i] - level) / (y[i] - y[j]);
      return x[i] + f * (x[j] - x[i]);
    }
  }
  return NaN;
}
