/**
 * Group curves from summed power spectra: the Fourier transform is linear,
 * so one inverse transform of Σ w·|X|² gives Σ w·A[m], the weighted sum of
 * the series' autocorrelations. Checked against the definitions summed
 * term by term (A[m] = Σ_k x_k·x_{k+m}; MSD(m) = mean over origins of
 * (x_{k+m} − x_k)²), which need no transform at all.
 */
import { describe, expect, it } from 'vitest';
import { Autocorrelator } from '../../../server/analysis/fft.ts';
import { FftMsd } from '../../../server/analysis/fft-msd.ts';

function lcg(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return state / 2 ** 32;
  };
}

function randomWalk(n: number, rnd: () => number, start: number): Float64Array {
  const x = new Float64Array(n);
  x[0] = start;
  for (let t = 1; t < n; t++) x[t] = x[t - 1]! + rnd() - 0.5;
  return x;
}

function directAutocorrelation(x: Float64Array, m: number): number {
  let s = 0;
  for (let k = 0; k + m < x.length; k++) s += x[k]! * x[k + m]!;
  return s;
}

function directMsd(x: Float64Array, m: number): number {
  let s = 0;
  for (let k = 0; k + m < x.length; k++) s += (x[k + m]! - x[k]!) ** 2;
  return s / (x.length - m);
}

describe('curves of a group from its summed power spectra', () => {
  const rnd = lcg(17);
  const n = 301;
  const series = Array.from({ length: 7 }, (_, k) => randomWalk(n, rnd, 40 * k));
  const weights = [1, 2.5, 16, 1, 0.5, 12, 3];

  it('when weighted powers are summed, then one inverse transform gives the weighted sum of the autocorrelations', () => {
    const correlator = new Autocorrelator(n);
    const power = new Float64Array(correlator.powerLength);
    series.forEach((x, k) => correlator.addPower(x, power, 0, weights[k]));
    const sums = correlator.lagSumsOf(power, new Float64Array(n));
    for (const m of [0, 1, 2, 50, 150, 299, 300]) {
      const want = series.reduce((s, x, k) => s + weights[k]! * directAutocorrelation(x, m), 0);
      expect(Math.abs(sums[m]! - want)).toBeLessThan(1e-9 * Math.abs(series.reduce((s, x, k) => s + weights[k]! * directAutocorrelation(x, 0), 0)));
    }
  });

  it('when MSD ingredients of several series are summed, then their curve is the sum of the MSDs over all origins', () => {
    const engine = new FftMsd(n, 200);
    const sum = engine.newSum();
    series.forEach((x) => engine.addTo(x, 0, sum));
    const curve = engine.curveOf(sum);
    for (const m of [0, 1, 7, 100, 199]) {
      const want = series.reduce((s, x) => s + directMsd(x, m), 0);
      expect(Math.abs(curve[m]! - want)).toBeLessThan(1e-8 * Math.max(1, want));
    }
  });

  it('when the group is one series, then the summed path equals the per-series path', () => {
    const engine = new FftMsd(n, 200);
    const one = engine.newSum();
    engine.addTo(series[3]!, 0, one);
    const perSeries = new Float64Array(200);
    engine.accumulate(series[3]!, 0, perSeries);
    const summed = engine.curveOf(one);
    for (let m = 0; m < 200; m++) expect(summed[m]).toBeCloseTo(perSeries[m]!, 9);
  });
});
