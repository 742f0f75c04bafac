import { describe, expect, it } from 'vitest';
import { findPeaks } from '../../../server/analysis/peaks.ts';

const grid = (n: number, dx: number) => Float64Array.from({ length: n }, (_, i) => i * dx);
const gaussian = (x: number, centre: number, sigma: number) => Math.exp(-((x - centre) ** 2) / (2 * sigma * sigma));

describe('peak finding in a spectrum', () => {
  it('when two separate Gaussian lines are present, then both are found at their centres with FWHM = 2√(2 ln 2)σ', () => {
    // The FWHM of a Gaussian is 2√(2 ln 2)·σ (COMMON PRACTICE).
    const x = grid(4001, 0.01);
    const y = x.map((v) => gaussian(v, 12.3, 0.4) + 0.5 * gaussian(v, 27.1, 0.6));
    const peaks = findPeaks(x, y);
    expect(peaks.map((p) => p.position)).toHaveLength(2);
    expect(peaks[0]!.position).toBeCloseTo(12.3, 6);
    expect(peaks[1]!.position).toBeCloseTo(27.1, 6);
    expect(peaks[0]!.fwhm).toBeCloseTo(2 * Math.sqrt(2 * Math.log(2)) * 0.4, 3);
  });

  it('when a broad band carries small ripples, then it is one peak, not a list of ripples', () => {
    const x = grid(2001, 0.01);
    const y = x.map((v) => gaussian(v, 8, 3) * (1 + 0.03 * Math.sin(7 * v)));
    expect(findPeaks(x, y)).toHaveLength(1);
  });
});
