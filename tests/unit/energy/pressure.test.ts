import { describe, expect, it } from 'vitest';
import { BAR_PER_EV_PER_A3, BOLTZMANN_EV_PER_K } from '../../../shared/energy-units.ts';
import { interactionModelSchema, type InteractionModelInput } from '../../../shared/interaction-model.ts';
import { BOLTZMANN_ENGINE } from '../../../server/analysis/constants.ts';
import { energy } from '../../../server/analysis/energy.ts';
import { compileModel, FrameEnergyEvaluator } from '../../../server/analysis/pair-energy.ts';
import type { Trajectory } from '../../../server/analysis/trajectory.ts';
import { fccLattice } from '../../../server/simulate/fcc-lattice.ts';
import { SeededRandom } from '../../../server/simulate/random.ts';

/** U(positions, cell) and the virial of one frame. */
function frame(input: InteractionModelInput, positions: Float64Array, cell: number[]) {
  const n = positions.length / 3;
  const ev = new FrameEnergyEvaluator(compileModel(interactionModelSchema.parse(input), ['Ar']), new Array(n).fill('Ar'));
  return ev.evaluate(positions, 0, cell);
}

/** Applies x → (1 + ε)·x along the axes given (affine strain of positions and cell). */
function strained(positions: Float64Array, cell: number[], eps: [number, number, number]) {
  const p = positions.map((x, k) => x * (1 + eps[k % 3]));
  const c = cell.map((x, k) => x * (1 + eps[k % 3]));
  return { p, c };
}

// Static lattice: the virial pressure must equal −dU/dV (SCIENCE items 26–27, COMMON PRACTICE), and each
// diagonal virial component W_αα must equal −∂U/∂ε_αα for an affine strain along α.
describe('static-lattice pressure: the virial equals −dU/dV', () => {
  const models: [string, InteractionModelInput][] = [
    ['LJ, truncated', { pairs: [{ species: ['Ar', 'Ar'], form: 'lj', epsilonK: 119.8, sigmaA: 3.405, cutoffA: 10.28 }] }],
    ['Morse, shifted', { pairs: [{ species: ['Ar', 'Ar'], form: 'morse', depthEV: 0.0104, alphaPerA: 1.6, r0A: 3.82, cutoffA: 10.28, truncation: 'shifted' }] }],
    ['Buckingham, force-shifted', { pairs: [{ species: ['Ar', 'Ar'], form: 'buckingham', aEV: 1200, rhoA: 0.30, cEVA6: 6.0, cutoffA: 10.28, truncation: 'force-shifted' }] }],
  ];
  const a = 5.31;
  // A sheared (triclinic) cell spanning the same 2×2×2 FCC supercell, with the atoms jittered so forces do not cancel by symmetry.
  const base = fccLattice(2, a);
  const rng = new SeededRandom(7);
  // Jitter of 0.04 Å keeps every pair distance far from the cut-off, placed in the gap between the 7th (9.93 Å) and 8th (10.62 Å) FCC shells.
  const positions = base.map((x) => x + 0.04 * rng.normal());
  const cells: [string, number[]][] = [
    ['cubic', [2 * a, 0, 0, 0, 2 * a, 0, 0, 0, 2 * a]],
    ['triclinic', [2 * a, 0, 0, 2 * a, 2 * a, 0, -2 * a, 0, 2 * a]],
  ];
  for (const [name, model] of models)
    for (const [shape, cell] of cells)
      it(`when the ${shape} cell holds ${name}, then W_αα = −∂U/∂ε_αα and P = −dU/dV by central differences to 1e-6`, () => {
        const e = frame(model, positions, cell);
        const h = 1e-5;
        for (let axis = 0; axis < 3; axis++) {
          const plus: [number, number, number] = [0, 0, 0], minus: [number, number, number] = [0, 0, 0];
          plus[axis] = h;
          minus[axis] = -h;
          const up = strained(positions, cell, plus), down = strained(positions, cell, minus);
          const dUde = (frame(model, up.p, up.c).pairEV - frame(model, down.p, down.c).pairEV) / (2 * h);
          expect(Math.abs(e.virialEV[axis] + dUde)).toBeLessThan(1e-6 * Math.max(1e-3, Math.abs(dUde)) + 1e-9);
        }
        // Isotropic: V → (1+ε)³V, so dU/dV = (dU/dε)/(3V).
        const up = strained(positions, cell, [h, h, h]), down = strained(positions, cell, [-h, -h, -h]);
        const dUdV = (frame(model, up.p, up.c).pairEV - frame(model, down.p, down.c).pairEV) / (2 * h) / (3 * e.volumeA3);
        const pVirial = (e.virialEV[0] + e.virialEV[1] + e.virialEV[2]) / (3 * e.volumeA3);
        expect(Math.abs(pVirial + dUdV)).toBeLessThan(1e-6 * Math.abs(dUdV) + 1e-12);
      });

  it('when an LJ FCC crystal sits at its static minimum (a = 1.5417σ with full sums, SCIENCE item 14), then the truncated-plus-tail virial pressure is near zero and changes sign across it', () => {
    const sigma = 3.405;
    const p = (aA: number): number => {
      const e = frame({ pairs: [{ species: ['Ar', 'Ar'], form: 'lj', epsilonK: 119.8, sigmaA: sigma, cutoffA: 8 * sigma, tailCorrection: true }] }, fccLattice(1, aA), [aA, 0, 0, 0, aA, 0, 0, 0, aA]);
      return (e.virialEV[0] + e.virialEV[1] + e.virialEV[2]) / (3 * e.volumeA3) + e.tailPressureEVPerA3;
    };
    expect(p(1.5417 * sigma * 0.99)).toBeGreaterThan(0);
    expect(p(1.5417 * sigma * 1.01)).toBeLessThan(0);
    expect(Math.abs(p(1.5417 * sigma)) * BAR_PER_EV_PER_A3).toBeLessThan(20);
  });
});

describe('ideal gas: P = ρ·k_B·T (SCIENCE item 27, COMMON PRACTICE)', () => {
  it('when the atoms do not interact, then every frame\'s pressure is N k_B T/V with T the kinetic temperature, and the mean matches ρ k_B T_set within its error', () => {
    const N = 500, T = 120, frames = 200, L = 40, mass = 39.948;
    const rng = new SeededRandom(3);
    const positions = new Float32Array(3 * N * frames), velocities = new Float32Array(3 * N * frames);
    const s = Math.sqrt((BOLTZMANN_ENGINE * T) / mass);
    for (let k = 0; k < positions.length; k++) {
      positions[k] = rng.uniform() * L;
      velocities[k] = s * rng.normal();
    }
    const cells = new Float64Array(9 * frames);
    for (let f = 0; f < frames; f++) (cells[9 * f] = L), (cells[9 * f + 4] = L), (cells[9 * f + 8] = L);
    const traj: Trajectory = { nAtoms: N, nFrames: frames, species: new Array(N).fill('Ar'), positions, velocities, cells, times: Float64Array.from({ length: frames }, (_, f) => f * 0.01), boundary: 'periodic' };
    const r = energy(traj, { model: interactionModelSchema.parse({ pairs: [{ species: ['Ar', 'Ar'], form: 'none' }] }), masses: { Ar: mass } });
    for (let f = 0; f < frames; f++) {
      const ideal = ((N * BOLTZMANN_EV_PER_K * r.temperatureK[f]) / L ** 3) * BAR_PER_EV_PER_A3;
      expect(Math.abs(r.pressureBar![f] / ideal - 1)).toBeLessThan(1e-12);
    }
    const expected = ((N * BOLTZMANN_EV_PER_K * T) / L ** 3) * BAR_PER_EV_PER_A3;
    const mean = r.means.pressureBar!;
    expect(Math.abs(mean.mean - expected)).toBeLessThan(3 * mean.stdError);
    expect(mean.stdError / expected).toBeLessThan(0.01);
    expect(r.potentialPerAtomEV!.every((u) => u === 0)).toBe(true);
  });
});

describe('LJ tail corrections (SCIENCE item 27; Allen & Tildesley, FROM MEMORY)', () => {
  it('when a truncated LJ pair asks for tail corrections, then U_tail/N = (8/3)πρεσ³[(σ/rc)⁹/3 − (σ/rc)³] and P_tail = (16/3)πρ²εσ³[(2/3)(σ/rc)⁹ − (σ/rc)³]; a mixture sums over ordered species pairs', () => {
    const sigma = 3.405, eps = 0.0103236, rc = 2.5 * sigma, L = 30;
    const rng = new SeededRandom(5);
    const n = 400;
    const positions = Float64Array.from({ length: 3 * n }, () => rng.uniform() * L);
    const e = frame({ pairs: [{ species: ['Ar', 'Ar'], form: 'lj', epsilonEV: eps, sigmaA: sigma, cutoffA: rc, tailCorrection: true }] }, positions, [L, 0, 0, 0, L, 0, 0, 0, L]);
    const rho = n / L ** 3, x = sigma / rc;
    expect(e.tailEV / n).toBeCloseTo((8 / 3) * Math.PI * rho * eps * sigma ** 3 * (x ** 9 / 3 - x ** 3), 14);
    expect(e.tailPressureEVPerA3).toBeCloseTo((16 / 3) * Math.PI * rho ** 2 * eps * sigma ** 3 * ((2 / 3) * x ** 9 - x ** 3), 16);
    // Two species with identical parameters must give the one-species answer (ordered pairs counted once each).
    const species = Array.from({ length: n }, (_, i) => (i % 3 === 0 ? 'Kr' : 'Ar'));
    const model = interactionModelSchema.parse({ pairs: ['Ar', 'Kr'].map((s) => ({ species: [s, s], form: 'lj', epsilonEV: eps, sigmaA: sigma, cutoffA: rc, tailCorrection: true })) });
    const mixed = new FrameEnergyEvaluator(compileModel(model, species), species).evaluate(positions, 0, [L, 0, 0, 0, L, 0, 0, 0, L]);
    expect(mixed.tailEV).toBeCloseTo(e.tailEV, 12);
    expect(mixed.pairEV).toBeCloseTo(e.pairEV, 9);
  });
});
