import { describe, expect, it } from 'vitest';
import { fitDiffusion } from '../../../server/analysis/diffusion-fit.ts';
import { FftMsd } from '../../../server/analysis/fft-msd.ts';
import { msd } from '../../../server/analysis/msd.ts';
import { SeededRandom } from '../../../server/simulate/random.ts';
import { cubicCells, makeTrajectory, randomWalk } from './synthetic.ts';

/** Direct O(T²) MSD of one series: (1/(T−m))·Σ_k (x_{k+m} − x_k)². */
function directMsd(x: Float64Array, nLags: number): Float64Array {
  const T = x.length;
  const out = new Float64Array(nLags);
  for (let m = 0; m < nLags; m++) {
    let s = 0;
    for (let k = 0; k + m < T; k++) s += (x[k + m] - x[k]) ** 2;
    out[m] = s / (T - m);
  }
  return out;
}

function walkSeries(T: number, seed: number): Float64Array {
  const rng = new SeededRandom(seed);
  const x = new Float64Array(T);
  for (let t = 1; t < T; t++) x[t] = x[t - 1] + rng.normal();
  return x;
}

function maxRelativeError(a: Float64Array, b: Float64Array, from = 1): number {
  let e = 0;
  for (let i = from; i < a.length; i++) e = Math.max(e, Math.abs(a[i] - b[i]) / Math.max(Math.abs(b[i]), 1e-300));
  return e;
}

describe('FFT MSD (SCIENCE item 2: Wiener–Khinchin with zero padding [CONFIRMED Futrelle & McGinty 1971]; S1 recursion [FROM MEMORY Kneller et al. 1995])', () => {
  it('when 20 random walks of 500 frames are analysed, then FFT and direct MSD agree to 1e-9 relative at every lag', () => {
    for (let atom = 0; atom < 20; atom++) {
      const x = walkSeries(500, 100 + atom);
      const fft = new Float64Array(500);
      new FftMsd(500, 500).accumulate(x, 0, fft);
      expect(maxRelativeError(fft, directMsd(x, 500))).toBeLessThan(1e-9);
    }
  });

  it.each([1, 2, 3, 7, 333, 999])('when the series has %i frames (odd, not a power of two, tiny), then FFT equals direct', (T) => {
    const x = walkSeries(T, T);
    const fft = new Float64Array(T);
    new FftMsd(T, T).accumulate(x, 0, fft);
    const direct = directMsd(x, T);
    for (let m = 0; m < T; m++) expect(Math.abs(fft[m] - direct[m])).toBeLessThanOrEqual(1e-9 * Math.max(1, direct[m]));
  });

  it('when the zero padding is dropped, then cyclic wrap-around makes the same comparison fail', () => {
    const x = walkSeries(512, 5);
    const unpadded = new Float64Array(256);
    new FftMsd(512, 256, { zeroPad: false }).accumulate(x, 0, unpadded);
    expect(maxRelativeError(unpadded, directMsd(x, 256))).toBeGreaterThan(1e-3);
  });
});

describe('Einstein relation MSD → 2dDt (SCIENCE item 1 [CONFIRMED Einstein 1905])', () => {
  it('when atoms move ballistically, then MSD(lag) = |v|²·(lag·Δt)² to 1e-9 relative', () => {
    const rng = new SeededRandom(3);
    const v = Array.from({ length: 10 }, () => [rng.normal(), rng.normal(), rng.normal()]);
    const traj = makeTrajectory(10, 200, 0.5, (f, i, out) => {
      for (let c = 0; c < 3; c++) out[c] = v[i][c] * f * 0.5;
    });
    // Float32 storage limits the ballistic positions to ~1e-7 relative, so
    // this check compares in Float64 through the per-series engine instead.
    const engine = new FftMsd(200, 100);
    const acc = new Float64Array(100);
    const series = new Float64Array(200);
    let v2 = 0;
    for (let i = 0; i < 10; i++)
      for (let c = 0; c < 3; c++) {
        for (let f = 0; f < 200; f++) series[f] = v[i][c] * f * 0.5;
        engine.accumulate(series, 0, acc, 0.1);
        v2 += v[i][c] ** 2 / 10;
      }
    for (let m = 1; m < 100; m++) expect(Math.abs(acc[m] - v2 * (m * 0.5) ** 2) / (v2 * (m * 0.5) ** 2)).toBeLessThan(1e-9);
    // End to end through Float32 positions, at single-precision tolerance.
    const r = msd(traj, { removeComDrift: false });
    const curve = r.groups[0].msdA2;
    for (let m = 1; m < curve.length; m++) expect(curve[m] / (v2 * (m * 0.5) ** 2)).toBeCloseTo(1, 5);
    expect(r.groups[0].diffusion.regime).toBe('superdiffusive');
  });

  it.each([1, 2, 3])('when 1000 Brownian walkers move in %i dimension(s), then D fitted on lags 1–100 is within 3 % of the input', (d) => {
    const D = 0.25, dt = 0.1;
    const traj = randomWalk(1000, 1000, dt, D, 40 + d, d);
    const comps = (['x', 'xy', 'xyz'] as const)[d - 1];
    const r = msd(traj, { components: comps, removeComDrift: false, fitWindowPs: { startPs: dt, endPs: 100 * dt } });
    const fit = r.groups[0].diffusion;
    expect(r.dimensions).toBe(d);
    expect(Math.abs((fit.d?.a2PerPs ?? 0) / D - 1)).toBeLessThan(0.03);
    // The automatic window must also find diffusion and agree.
    const auto = msd(traj, { components: comps, removeComDrift: false }).groups[0].diffusion;
    expect(auto.regime).toBe('diffusive');
    expect(Math.abs((auto.d?.a2PerPs ?? 0) / D - 1)).toBeLessThan(4 * (auto.dStdError?.a2PerPs ?? 0) / D + 0.01);
  });

  it('when a particle crosses a periodic box at constant velocity and is stored wrapped, then the unwrapped MSD is still v²t²', () => {
    const L = 10, vx = 0.7, vy = -0.3, dt = 1;
    const traj = makeTrajectory(1, 100, dt, (f, _i, out) => {
      out[0] = ((1 + vx * f) % L + L) % L;
      out[1] = ((5 + vy * f) % L + L) % L;
      out[2] = 2;
    }, { cells: cubicCells(100, L), boundary: 'periodic' });
    const r = msd(traj, { removeComDrift: false });
    expect(r.unwrapped).toBe(true);
    const v2 = vx * vx + vy * vy;
    for (let m = 1; m < r.lagPs.length; m++) expect(r.groups[0].msdA2[m] / (v2 * m * m)).toBeCloseTo(1, 4);
  });

  it('when the box breathes (NPT-like) and a barostat rescales the wrapped coordinate, then unwrapping follows the real frame-to-frame displacement, not k·ΔL jumps', () => {
    // von Bülow, Bullerjahn & Hummer, J. Chem. Phys. 153, 021101 (2020) [FROM MEMORY]:
    // accumulate minimum-image displacements rather than rescaling image counts.
    const T = 400, v = 0.9;
    const cells = new Float64Array(9 * T);
    const wrapped = new Float64Array(T), truth = new Float64Array(T);
    for (let f = 0; f < T; f++) {
      const L = 10 * (1 + 0.02 * Math.sin(f / 7));
      (cells[9 * f] = L), (cells[9 * f + 4] = L), (cells[9 * f + 8] = L);
      if (f === 0) (wrapped[0] = 1), (truth[0] = 1);
      else {
        const scaled = wrapped[f - 1] * (L / cells[9 * (f - 1)]);
        truth[f] = truth[f - 1] + (scaled - wrapped[f - 1]) + v;
        wrapped[f] = (((scaled + v) % L) + L) % L;
      }
    }
    const traj = makeTrajectory(1, T, 1, (f, _i, out) => {
      out[0] = wrapped[f];
      out[1] = 1;
      out[2] = 1;
    }, { cells, boundary: 'periodic' });
    const r = msd(traj, { removeComDrift: false });
    const expected = directMsd(truth, r.lagPs.length);
    for (let m = 1; m < r.lagPs.length; m++) expect(r.groups[0].msdA2[m] / expected[m]).toBeCloseTo(1, 4);
    // Rescaling image counts with the current box would instead add k·ΔL jumps of up to ~7 Å here.
    let worst = 0;
    for (let f = 1; f < T; f++) worst = Math.max(worst, Math.abs(Math.floor((truth[f] - wrapped[f]) / cells[9 * f] + 0.5) * (cells[9 * f] - cells[9 * (f - 1)])));
    expect(worst).toBeGreaterThan(0.1);
  });

  it('when an MSD slope of 6·0.2299 Å²/ps is fitted, then D is reported as 2.299e-9 m²/s and 2.299e-5 cm²/s (SCIENCE item 12: 1 Å²/ps = 1e-8 m²/s [DERIVED]; water value [CONFIRMED, Mills 1973 as quoted])', () => {
    const lagPs = Float64Array.from({ length: 50 }, (_, i) => i * 0.1);
    const line = lagPs.map((t) => 6 * 0.2299 * t);
    const fit = fitDiffusion({ lagPs, msd: line, blocks: [], dimensions: 3, endIndex: 49 });
    expect(fit.regime).toBe('diffusive');
    expect(fit.d?.e9M2PerS).toBeCloseTo(2.299, 10);
    expect(fit.d?.cm2PerS).toBeCloseTo(2.299e-5, 14);
  });

  it('when the run is too short for a fit, then no D is reported', () => {
    const r = msd(randomWalk(5, 6, 1, 1, 2), { removeComDrift: false });
    expect(r.groups[0].diffusion.regime).toBe('too-short');
    expect(r.groups[0].diffusion.d).toBeNull();
  });
});
