/**
 * The cell-list search meets every pair within the cut-off exactly once,
 * whatever the boundaries: checked against an O(N²) sum over every pair and
 * every periodic image, computed here, for disordered atoms (where sub-cells
 * are unevenly filled and pairs sit near every sub-cell face and corner).
 */
import { describe, expect, it } from 'vitest';
import { interactionModelSchema } from '../../../shared/interaction-model.ts';
import { compileModel, FrameEnergyEvaluator } from '../../../server/analysis/pair-energy.ts';
import { SeededRandom } from '../../../server/simulate/random.ts';

const SIGMA = 3.405, EPS_EV = 0.0103236;

interface Sums {
  energy: number;
  virial: number[];
  pairs: number;
}

/** Every pair and every image within rc along the periodic axes, by brute force (rectangular box). */
function bruteForce(x: Float64Array, box: number[], periodic: boolean[], rc: number): Sums {
  const n = x.length / 3;
  const reach = box.map((l, k) => (periodic[k] ? Math.ceil(rc / l) + 1 : 0));
  const out: Sums = { energy: 0, virial: [0, 0, 0, 0, 0, 0], pairs: 0 };
  for (let i = 0; i < n; i++)
    for (let j = i; j < n; j++)
      for (let a = -reach[0]; a <= reach[0]; a++)
        for (let b = -reach[1]; b <= reach[1]; b++)
          for (let c = -reach[2]; c <= reach[2]; c++) {
            if (i === j && (a > 0 || (a === 0 && (b > 0 || (b === 0 && c >= 0))))) continue; // each self-image pair once
            const dx = x[3 * i] - x[3 * j] - a * box[0], dy = x[3 * i + 1] - x[3 * j + 1] - b * box[1], dz = x[3 * i + 2] - x[3 * j + 2] - c * box[2];
            const r2 = dx * dx + dy * dy + dz * dz;
            if (r2 >= rc * rc) continue;
            const s6 = (SIGMA * SIGMA / r2) ** 3;
            const fOverR = (24 * EPS_EV * (2 * s6 * s6 - s6)) / r2;
            out.energy += 4 * EPS_EV * (s6 * s6 - s6);
            [dx * dx, dy * dy, dz * dz, dx * dy, dx * dz, dy * dz].forEach((d, k) => (out.virial[k] += fOverR * d));
            out.pairs++;
          }
  return out;
}

function disordered(n: number, box: number[], seed: number): Float64Array {
  const rng = new SeededRandom(seed);
  // Some atoms outside the box, as unwrapped files give them.
  return Float64Array.from({ length: 3 * n }, (_, k) => (rng.uniform() * 1.2 - 0.1) * box[k % 3]);
}

/** Equal up to the order the pairs are summed in (random atoms overlap, so single pairs reach huge energies). */
function same(got: { pairEV: number; virialEV: Float64Array }, want: Sums): void {
  const close = (a: number, b: number) => expect(Math.abs(a - b)).toBeLessThanOrEqual(1e-12 * Math.abs(b));
  close(got.pairEV, want.energy);
  Array.from(got.virialEV).forEach((w, k) => close(w, want.virial[k]));
}

describe('neighbour search against a brute-force sum', () => {
  const model = interactionModelSchema.parse({ pairs: [{ species: ['Ar', 'Ar'], form: 'lj', epsilonEV: EPS_EV, sigmaA: SIGMA, cutoffA: 9 }] });
  const cases: [string, number[], boolean[]][] = [
    ['a bulk box about 3.5 cut-offs wide', [31, 33.5, 29], [true, true, true]],
    ['a box narrower than two cut-offs (several images of one atom)', [14, 16.5, 31], [true, true, true]],
    ['a slab periodic along x and y', [30, 28, 40], [true, true, false]],
  ];
  for (const [name, box, periodic] of cases) {
    it(`when the atoms fill ${name}, then energy, virial and pair count equal the sum over every pair and image`, () => {
      const x = disordered(400, box, 7);
      const ev = new FrameEnergyEvaluator(compileModel(model, ['Ar']), new Array<string>(400).fill('Ar'));
      const got = ev.evaluate(x, 0, [box[0], 0, 0, 0, box[1], 0, 0, 0, box[2]], 0, periodic);
      const want = bruteForce(x, box, periodic, 9);
      expect(got.pairs).toBe(want.pairs);
      same(got, want);
    });
  }

  it('when the boundaries are open, then energy, virial and pair count equal the sum over every pair', () => {
    const box = [35, 30, 26];
    const x = disordered(400, box, 11);
    const ev = new FrameEnergyEvaluator(compileModel(model, ['Ar']), new Array<string>(400).fill('Ar'));
    const got = ev.evaluate(x, 0, null);
    const want = bruteForce(x, box, [false, false, false], 9);
    expect(got.pairs).toBe(want.pairs);
    same(got, want);
  });
});
