import { describe, expect, it } from 'vitest';
import { rdf } from '../../../server/analysis/rdf.ts';
import { structureFactor } from '../../../server/analysis/sq.ts';
import { fccLattice } from '../../../server/simulate/fcc-lattice.ts';
import { SeededRandom } from '../../../server/simulate/random.ts';
import { cubicCells, makeTrajectory } from './synthetic.ts';

function fccTrajectory(nc: number, a: number, frames: number, jitter: number, seed: number) {
  const sites = fccLattice(nc, a);
  const rng = new SeededRandom(seed);
  const n = sites.length / 3;
  return makeTrajectory(n, frames, 1, (_f, i, out) => {
    for (let c = 0; c < 3; c++) out[c] = sites[3 * i + c] + jitter * rng.normal();
  }, { cells: cubicCells(frames, nc * a), boundary: 'periodic' });
}

// SCIENCE item 14: FCC shells r/a = √(n/2) with cumulative counts 12, 18, 42, 54, 78, 86, 134
// [DERIVED by lattice enumeration; textbook, COMMON PRACTICE]. Al a = 4.05 Å [CONFIRMED Hermann 2011].
describe('FCC coordination shells (SCIENCE item 14)', () => {
  const a = 4.05;
  const cumulative = [12, 18, 42, 54, 78, 86, 134];

  it('when a perfect 5×5×5 FCC crystal is analysed, then the running coordination steps to exactly the cumulative shell counts', () => {
    const r = rdf(fccTrajectory(5, a, 1, 0, 1), { binWidthA: 0.01 });
    cumulative.forEach((count, s) => {
      const between = a * (Math.sqrt((s + 1) / 2) + Math.sqrt((s + 2) / 2)) / 2;
      const k = Math.floor(between / r.binWidthA);
      expect(Math.abs(r.total.coordination[k] - count)).toBeLessThan(1e-12);
    });
    expect(r.total.firstMinimum?.coordination).toBeCloseTo(12, 12);
  });

  it('when the box is 4 cells (L/2 = 2a), then the shell at exactly L/2 is not counted (only r < L/2)', () => {
    const r = rdf(fccTrajectory(4, a, 1, 0, 1), { binWidthA: 0.01 });
    expect(r.rMaxA).toBeCloseTo(2 * a, 12);
    expect(r.total.coordination[r.total.coordination.length - 1]).toBeCloseTo(134, 12);
  });

  it('when atoms jitter with rms 0.02a, then the first peak still integrates to 12.00 ± 0.01 up to the first minimum', () => {
    const r = rdf(fccTrajectory(5, a, 5, 0.02 * a, 3), { binWidthA: 0.02 });
    expect(Math.abs((r.total.firstMinimum?.coordination ?? 0) - 12)).toBeLessThan(0.01);
    expect(r.total.firstPeak?.rA).toBeCloseTo(a / Math.SQRT2, 1);
  });
});

// SCIENCE item 15: ideal gas g = 1 with ρ = (N−1)/V, or (N−1)/N with N/V [COMMON PRACTICE]. The engine
// documents and uses (N−1)/V for like pairs.
describe('Ideal-gas g(r) pins the normalisation convention (SCIENCE item 15)', () => {
  const L = 10, N = 500, frames = 50;
  const rng = new SeededRandom(15);
  const traj = makeTrajectory(N, frames, 1, (_f, _i, out) => {
    for (let c = 0; c < 3; c++) out[c] = L * rng.uniform();
  }, { cells: cubicCells(frames, L), boundary: 'periodic' });

  it('when 500 uniform points are binned to L/2 in 50 bins, then g averages 1.000 ± 0.005 beyond r = 1 and every bin is within 1 ± 0.03', () => {
    const r = rdf(traj, { binWidthA: 0.1 });
    let sum = 0, count = 0;
    r.total.g.forEach((g, k) => {
      if (r.rA[k] <= 1) return;
      sum += g;
      count++;
      expect(Math.abs(g - 1)).toBeLessThan(0.03);
    });
    expect(Math.abs(sum / count - 1)).toBeLessThan(0.005);
    // N/V would give 1 − 1/N = 0.998 instead; the convention is stated in the result.
    expect(r.normalisation).toContain('(N_a−1)/V');
  });

  it('when cell lists are forced, then the histogram equals the brute-force one exactly', () => {
    const brute = rdf(traj, { rMaxA: 3, binWidthA: 0.1, method: 'brute-force' });
    const cells = rdf(traj, { rMaxA: 3, binWidthA: 0.1, method: 'cell-list' });
    expect(cells.method).toBe('cell-list');
    expect(Array.from(cells.total.g)).toEqual(Array.from(brute.total.g));
  });

  it('when many atoms and a short r_max are given, then the automatic path uses cell lists', () => {
    expect(rdf(traj, { rMaxA: 3, frameStride: 25 }).method).toBe('cell-list');
  });

  it('when r_max exceeds half the box, then a clear error is raised', () => {
    expect(() => rdf(traj, { rMaxA: 6 })).toThrow(/half the shortest box edge/);
  });

  it('when two species are present, then unlike-pair coordination uses N_b/V and partial g(r) are each ≈ 1', () => {
    const mixed = { ...traj, species: traj.species.map((_, i) => (i % 5 === 0 ? 'Ne' : 'Ar')) };
    const r = rdf(mixed, { binWidthA: 0.25 });
    for (const p of r.pairs) {
      let sum = 0, count = 0;
      p.g.forEach((g, k) => r.rA[k] > 2 && ((sum += g), count++));
      expect(Math.abs(sum / count - 1)).toBeLessThan(0.02);
    }
    // Species are listed in order of first appearance: atom 0 is Ne, so the unlike pair is Ne-Ar,
    // and its coordination counts Ar (400 per 1000 Å³) around each Ne.
    const neAr = r.pairs.find((p) => p.a === 'Ne' && p.b === 'Ar');
    expect(neAr).toBeDefined();
    const last = r.rA.length - 1;
    const sphere = (4 / 3) * Math.PI * r.rMaxA ** 3;
    expect(Math.abs((neAr?.coordination[last] ?? 0) / ((400 / 1000) * sphere) - 1)).toBeLessThan(0.02);
  });
});

describe('S(q) from g(r) (Fourier–Bessel transform [COMMON PRACTICE])', () => {
  it('when g − 1 is a Gaussian hole −exp(−r²/2s²), then S(q) = 1 − ρ(2πs²)^{3/2}·exp(−q²s²/2) without a window [DERIVED]', () => {
    const dr = 0.005, s = 0.6, rho = 0.03;
    const rA = Float64Array.from({ length: 3000 }, (_, k) => (k + 0.5) * dr);
    const g = rA.map((r) => 1 - Math.exp(-(r * r) / (2 * s * s)));
    const out = structureFactor(rA, g, dr, rho, { sqWindow: 'none', dqInvA: 0.1, qMaxInvA: 10 });
    out.qInvA.forEach((q, i) => {
      const exact = 1 - rho * (2 * Math.PI * s * s) ** 1.5 * Math.exp(-(q * q * s * s) / 2);
      expect(Math.abs(out.s[i] - exact)).toBeLessThan(1e-6);
    });
  });

  it('when an ideal gas is transformed with the Lorch window, then S(q) stays 1 beyond the reliable q', () => {
    const rA = Float64Array.from({ length: 100 }, (_, k) => (k + 0.5) * 0.05);
    const out = structureFactor(rA, new Float64Array(100).fill(1), 0.05, 0.02);
    out.s.forEach((v) => expect(v).toBeCloseTo(1, 12));
    expect(out.window).toBe('lorch');
  });
});
