import { describe, expect, it } from 'vitest';
import { interactionModelSchema } from '../../../shared/interaction-model.ts';
import { compileModel, FrameEnergyEvaluator } from '../../../server/analysis/pair-energy.ts';
import { fccLattice } from '../../../server/simulate/fcc-lattice.ts';

// Argon LJ: σ = 3.405 Å, ε/k_B = 119.8 K (Rowley, Nicholson & Parsonage; SCIENCE item 9).
const SIGMA = 3.405, EPS_K = 119.8, EPS_EV = EPS_K * 8.617333262e-5;
// FCC lattice sums A12 = 12.13188, A6 = 14.45392 (Kittel, crystal binding; Lennard-Jones & Ingham 1925) — FROM MEMORY (SCIENCE item 26).
const A12 = 12.13188, A6 = 14.45392;
const fullLatticeSum = (a: number): number => {
  const x = SIGMA / (a / Math.SQRT2);
  return 2 * EPS_EV * (A12 * x ** 12 - A6 * x ** 6);
};

const model = (cutoffA: number, extra: Record<string, unknown> = {}) =>
  interactionModelSchema.parse({ pairs: [{ species: ['Ar', 'Ar'], form: 'lj', epsilonK: EPS_K, sigmaA: SIGMA, cutoffA, ...extra }] });

/** Energy per atom the test computes itself: every image of every basis atom within rc, by brute force. */
function directSumPerAtom(a: number, rc: number): number {
  const basis = [[0, 0, 0], [0.5, 0.5, 0], [0.5, 0, 0.5], [0, 0.5, 0.5]];
  const M = Math.ceil(rc / a) + 1;
  let u = 0;
  for (const [bx, by, bz] of basis)
    for (let i = -M; i <= M; i++)
      for (let j = -M; j <= M; j++)
        for (let k = -M; k <= M; k++) {
          const r = a * Math.hypot(i + bx, j + by, k + bz);
          if (r === 0 || r >= rc) continue;
          const s6 = (SIGMA / r) ** 6;
          u += 4 * EPS_EV * (s6 * s6 - s6);
        }
  return u / 2;
}

function perAtom(cells: number, a: number, rc: number, lattice?: number[]): number {
  const positions = fccLattice(cells, a);
  const n = positions.length / 3;
  const L = cells * a;
  const ev = new FrameEnergyEvaluator(compileModel(model(rc), ['Ar']), new Array(n).fill('Ar'));
  return ev.evaluate(positions, 0, lattice ?? [L, 0, 0, 0, L, 0, 0, 0, L]).pairEV / n;
}

describe('LJ FCC lattice energy (SCIENCE item 26)', () => {
  const aMin = 1.0902 * Math.SQRT2 * SIGMA; // r_nn/σ = (2A12/A6)^(1/6) = 1.0902 at the minimum [DERIVED from the sums]

  for (const a of [5.0, aMin, 5.26, 5.6]) {
    it(`when a = ${a.toFixed(4)} Å and rc = 3σ, then the cell-list sum equals the direct lattice sum computed here to 1e-10`, () => {
      const rc = 3 * SIGMA;
      const direct = directSumPerAtom(a, rc);
      for (const cells of [1, 2, 4]) expect(Math.abs(perAtom(cells, a, rc) / direct - 1)).toBeLessThan(1e-10);
    });

    it(`when a = ${a.toFixed(4)} Å and rc = 8σ with the tail correction, then the energy matches the full lattice sum 2ε[A12x¹² − A6x⁶] within 2e-4 relative`, () => {
      const rc = 8 * SIGMA;
      const positions = fccLattice(1, a);
      const ev = new FrameEnergyEvaluator(compileModel(model(rc, { tailCorrection: true }), ['Ar']), ['Ar', 'Ar', 'Ar', 'Ar']);
      const e = ev.evaluate(positions, 0, [a, 0, 0, 0, a, 0, 0, 0, a]);
      expect(Math.abs((e.pairEV + e.tailEV) / 4 / fullLatticeSum(a) - 1)).toBeLessThan(2e-4);
    });
  }

  it('when a = 5.26 Å, then the full sums give −0.088876 eV/atom (SCIENCE item 26, DERIVED) and the minimum is −8.6102 ε', () => {
    expect(fullLatticeSum(5.26)).toBeCloseTo(-0.088876, 5);
    expect(fullLatticeSum(aMin) / EPS_EV).toBeCloseTo(-8.6102, 3);
  });

  it('when the same crystal is given as its one-atom rhombohedral (triclinic) primitive cell or a sheared supercell, then the energy per atom is unchanged', () => {
    const a = 5.26, rc = 3 * SIGMA;
    const cubic = perAtom(2, a, rc);
    const h = a / 2;
    const primitive = [0, h, h, h, 0, h, h, h, 0];
    const ev1 = new FrameEnergyEvaluator(compileModel(model(rc), ['Ar']), ['Ar']);
    expect(Math.abs(ev1.evaluate([0.3, -0.2, 0.1], 0, primitive).pairEV / cubic - 1)).toBeLessThan(1e-10);
    // Shear: b' = b + a, c' = c − 2a spans the same lattice.
    const sheared = [2 * a, 0, 0, 2 * a, 2 * a, 0, -4 * a, 0, 2 * a];
    const pos = fccLattice(2, a);
    const ev2 = new FrameEnergyEvaluator(compileModel(model(rc), ['Ar']), new Array(32).fill('Ar'));
    expect(Math.abs(ev2.evaluate(pos, 0, sheared).pairEV / 32 / cubic - 1)).toBeLessThan(1e-10);
  });
});
