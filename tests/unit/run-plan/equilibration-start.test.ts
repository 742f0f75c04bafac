import { describe, expect, it } from 'vitest';
import { equilibrationStart, statisticalInefficiency } from '../../../server/run-plan/equilibration-start.ts';
import { SeededRandom } from '../../../server/simulate/random.ts';

/** An AR(1) series x_t = φ x_{t−1} + ε, whose statistical inefficiency is (1 + φ)/(1 − φ) exactly. */
function ar1(n: number, phi: number, seed: number, start = 0): Float64Array {
  const random = new SeededRandom(seed);
  const x = new Float64Array(n);
  let v = start;
  for (let t = 0; t < n; t++) x[t] = v = phi * v + random.normal();
  return x;
}

describe('automated equilibration detection (Chodera, J. Chem. Theory Comput. 12, 1799 (2016))', () => {
  it('when the series is an AR(1) process, then its statistical inefficiency is near (1 + φ)/(1 − φ)', () => {
    // Exact result for an AR(1) process (textbook time-series algebra); ±15 % allows for the estimator's scatter at 200 000 samples.
    for (const phi of [0, 0.5, 0.9]) {
      const g = statisticalInefficiency(ar1(200_000, phi, 11));
      expect(g / ((1 + phi) / (1 - phi))).toBeGreaterThan(0.85);
      expect(g / ((1 + phi) / (1 - phi))).toBeLessThan(1.15);
    }
  });

  it('when a run starts far from equilibrium and relaxes, then the start is placed after the transient and before the tail', () => {
    // Relaxation time 500 frames from 40 noise widths away: after about 3000 frames the offset is below 0.1 σ.
    const x = ar1(20_000, 0.5, 5).map((v, t) => v + 40 * Math.exp(-t / 500));
    const start = equilibrationStart(x)!;
    expect(start.frame).toBeGreaterThan(1500);
    expect(start.frame).toBeLessThan(6000);
  });

  it('when the series is stationary from the start, then little or nothing is discarded', () => {
    const start = equilibrationStart(ar1(20_000, 0.8, 9))!;
    expect(start.frame).toBeLessThan(2000);
  });

  it('when the series is too short to judge, then there is no suggestion', () => {
    expect(equilibrationStart(new Float64Array(10))).toBeNull();
  });
});
