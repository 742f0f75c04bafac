import { describe, expect, it } from 'vitest';
import { BOLTZMANN_ENGINE } from '../../../server/analysis/constants.ts';
import { lindemann } from '../../../server/analysis/lindemann.ts';
import { msd } from '../../../server/analysis/msd.ts';
import { runAnalyses } from '../../../server/analysis/index.ts';
import { ngp } from '../../../server/analysis/ngp.ts';
import { fccLattice } from '../../../server/simulate/fcc-lattice.ts';
import { SeededRandom } from '../../../server/simulate/random.ts';
import { randomWalkMixture } from './known-answer-systems.ts';
import { cubicCells, makeTrajectory, randomWalk } from './synthetic.ts';

// SCIENCE item 17 [DERIVED]: two atoms at separation d with independent Gaussian jitter s per component
// give δ = √2·s/d + O((s/d)²); definition of q_i [CONFIRMED Wikipedia "Lindemann index"].
describe('Lindemann index (SCIENCE item 17)', () => {
  it.each([0.02, 0.05])('when a dimer jitters with s/d = %f, then the index is √2·s/d within 1.5 %', (ratio) => {
    const d = 3, s = ratio * d;
    const rng = new SeededRandom(17);
    const traj = makeTrajectory(2, 200_000, 0.001, (_f, i, out) => {
      out[0] = i * d + s * rng.normal();
      out[1] = s * rng.normal();
      out[2] = s * rng.normal();
    });
    const r = lindemann(traj);
    expect(r.form).toBe('all-pairs');
    // The O((s/d)²) term: the SCIENCE prototype gave 0.07014 against 0.07071 at s/d = 0.05.
    expect(Math.abs(r.index / (Math.SQRT2 * ratio) - 1)).toBeLessThan(0.015);
    expect(r.melted).toBe(false);
  });

  it('when the lattice is rigid, then the index is exactly 0', () => {
    const sites = fccLattice(2, 4);
    const traj = makeTrajectory(32, 10, 1, (_f, i, out) => out.set(sites.subarray(3 * i, 3 * i + 3)), { cells: cubicCells(10, 8), boundary: 'periodic' });
    expect(lindemann(traj).index).toBe(0);
  });

  it('when atoms random-walk as a cluster, then the index grows with run length and crosses the 0.1 melting threshold', () => {
    const walk = randomWalk(20, 4000, 0.1, 0.5, 5);
    const sites = fccLattice(2, 4);
    const shifted = { ...walk, positions: walk.positions.map((v, k) => v + sites[k % 60] * 3) };
    const short = lindemann({ ...shifted, nFrames: 100, positions: shifted.positions.subarray(0, 100 * 60), times: walk.times.subarray(0, 100) });
    const long = lindemann(shifted);
    expect(long.index).toBeGreaterThan(short.index);
    expect(long.melted).toBe(true);
    expect(long.threshold).toBe(0.1);
  });

});

// SCIENCE item 19 [COMMON PRACTICE]: independent 3-D harmonic oscillators with canonical amplitudes have
// MSD(t) = (6k_BT/(mω²))·(1 − cos ωt); the long-time D must be 0.
describe('Einstein solid: bounded MSD, no spurious D (SCIENCE item 19)', () => {
  const n = 4 * 5 ** 3, a = 5.26, T = 40, m = 39.95, period = 0.5, dt = 0.025, frames = 1600;
  const omega = (2 * Math.PI) / period;
  const sigma = Math.sqrt((BOLTZMANN_ENGINE * T) / (m * omega * omega));
  const sites = fccLattice(5, a);
  const rng = new SeededRandom(19);
  const x0 = Float64Array.from({ length: 3 * n }, () => sigma * rng.normal());
  const v0 = Float64Array.from({ length: 3 * n }, () => sigma * omega * rng.normal());
  const traj = makeTrajectory(n, frames, dt, (f, i, out) => {
    const c = Math.cos(omega * f * dt), s = Math.sin(omega * f * dt);
    for (let k = 0; k < 3; k++) out[k] = sites[3 * i + k] + x0[3 * i + k] * c + (v0[3 * i + k] / omega) * s;
  }, { cells: cubicCells(frames, 5 * a), boundary: 'periodic' });

  it('when the MSD is computed, then it matches 6k_BT/(mω²)·(1 − cos ωt) within 3 %', () => {
    const r = msd(traj, { removeComDrift: false });
    const amp = 6 * sigma * sigma;
    for (let k = 1; k < r.lagPs.length; k++) {
      const exact = amp * (1 - Math.cos(omega * r.lagPs[k]));
      if (exact > 0.2 * amp) expect(Math.abs(r.groups[0].msdA2[k] / exact - 1)).toBeLessThan(0.03);
    }
  });

  it('when D is fitted automatically, then none is reported: the motion is flagged bounded with its plateau', () => {
    const fit = msd(traj).groups[0].diffusion;
    expect(fit.regime).toBe('bounded');
    expect(fit.d).toBeNull();
    expect(Math.abs((fit.plateauA2 ?? 0) / (6 * sigma * sigma) - 1)).toBeLessThan(0.05);
  });

  it('when a late window spanning whole periods is fitted by hand, then |D| is below 1 % of a random-walk D (0.25 Å²/ps)', () => {
    const fit = msd(traj, { fitWindowPs: { startPs: 10, endPs: 18 } }).groups[0].diffusion;
    expect(fit.regime).toBe('bounded');
    expect(Math.abs(fit.d?.a2PerPs ?? 1)).toBeLessThan(0.01 * 0.25);
  });

  it('when the Lindemann displacement ratio is taken, then √⟨u²⟩/r_nn = √(3k_BT/(mω²))/r_nn within 2 %', () => {
    const r = lindemann(traj);
    expect(Math.abs(r.displacementRatio / (Math.sqrt(3) * sigma / (a / Math.SQRT2)) - 1)).toBeLessThan(0.02);
    expect(r.melted).toBe(false);
  });
});

// Non-Gaussian parameter α₂ = 3⟨r⁴⟩/(5⟨r²⟩²) − 1 (Rahman 1964 [CONFIRMED citation]).
describe('Non-Gaussian parameter', () => {
  it('when every atom moves ballistically at the same speed, then α₂ = 3/5 − 1 = −0.4 exactly [DERIVED]', () => {
    const rng = new SeededRandom(4);
    const dirs = Array.from({ length: 50 }, () => rng.unitVector(new Float64Array(3)));
    const traj = makeTrajectory(50, 200, 0.1, (f, i, out) => {
      for (let c = 0; c < 3; c++) out[c] = 2 * dirs[i][c] * f * 0.1;
    });
    const r = ngp(traj, { removeComDrift: false });
    r.groups[0].alpha2.forEach((v) => expect(v).toBeCloseTo(-0.4, 5));
  });

  it('when atoms take Gaussian random steps, then α₂ ≈ 0 at every lag', () => {
    const r = ngp(randomWalk(500, 1000, 0.1, 0.3, 6), { removeComDrift: false });
    r.groups[0].alpha2.forEach((v) => expect(Math.abs(v)).toBeLessThan(0.05));
  });

  // Pooling is what must not happen [DERIVED]: each Gaussian species has ⟨r⁴⟩ = (5/3)⟨r²⟩², so an equal mixture
  // with ⟨r²⟩ = a and b gives α₂ = 2(a² + b²)/(a + b)² − 1 = 0.669 for b = 10a; issue 9 saw 0.6–0.7 this way.
  it('when two species random-walk with D = 0.1 and 1.0 Å²/ps, then each species has |α₂| < 0.05 at every lag and nothing is pooled', () => {
    const mix = randomWalkMixture([{ species: 'Ar', atoms: 250, d: 0.1 }, { species: 'Ne', atoms: 250, d: 1.0 }], { frames: 1000, timeStepPs: 0.1, boxA: 30, seed: 3 });
    const r = ngp(mix, { removeComDrift: false });
    expect(r.groups.map((g) => g.label)).toEqual(['Ar', 'Ne']);
    for (const g of r.groups) g.alpha2.forEach((v) => expect(Math.abs(v)).toBeLessThan(0.05));
  });

  it('when the mixture goes through the report, then the summary lists α₂ per species and has no pooled peak', () => {
    const mix = randomWalkMixture([{ species: 'Ar', atoms: 100, d: 0.1 }, { species: 'Ne', atoms: 100, d: 1.0 }], { frames: 400, timeStepPs: 0.1, boxA: 30, seed: 4 });
    const s = runAnalyses(mix, ['ngp'], { removeComDrift: false }).summary.ngp!;
    expect(s.groups?.map((g) => g.label)).toEqual(['Ar', 'Ne']);
    expect(s.peakAlpha2).toBeNull();
    for (const g of s.groups!) expect(Math.abs(g.peakAlpha2!)).toBeLessThan(0.1);
  });
});
