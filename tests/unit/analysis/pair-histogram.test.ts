import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { BRUTE_FORCE_MAX_ATOMS, cellCounts, MAX_CELLS_PER_ATOM, PairHistogram, R_MAX_ROUNDOFF, type PairMethod } from '../../../server/analysis/pair-histogram.ts';
import { rdf } from '../../../server/analysis/rdf.ts';
import { SeededRandom } from '../../../server/simulate/random.ts';
import { referencePythonState } from '../../../scripts/services/reference-python.ts';
import { makeTrajectory } from './synthetic.ts';

type Box = [number, number, number];

/** N atoms of two types, uniform in the box but stored unwrapped (up to two boxes out on either side), some frames. */
function gas(n: number, box: Box, frames: number, seed: number): Float32Array {
  const rng = new SeededRandom(seed);
  const positions = new Float32Array(3 * n * frames);
  for (let k = 0; k < positions.length; k++) positions[k] = (rng.uniform() * 5 - 2) * box[k % 3]!;
  return positions;
}

/** Type 0 for even atoms, 1 for odd; slots 0 (0–0), 1 (0–1 and 1–0), 2 (1–1). */
const types = (n: number) => Int32Array.from({ length: n }, (_, i) => i % 2);
const SLOTS = Int32Array.from([0, 1, 1, 2]);

function histogram(method: PairMethod, positions: Float32Array, n: number, box: Box, rMax: number, nBins: number): { counts: Float64Array; method: string } {
  const h = new PairHistogram(n, types(n), SLOTS, 2, nBins, rMax, method);
  const counts = new Float64Array(3 * nBins);
  for (let offset = 0; offset < positions.length; offset += 3 * n) h.addFrame(positions, offset, box, counts);
  return { counts, method: h.lastMethod };
}

describe('cell lists against all pairs', () => {
  // Random orthorhombic boxes; r_max as a fraction of the shortest side, up to the minimum-image limit L/2.
  const boxes: Box[] = [[21.3, 21.3, 21.3], [18.7, 26.1, 33.9], [30.2, 19.4, 24.8]];
  const fractions = [2, 2.5, 3, 4];
  for (const [b, box] of boxes.entries()) {
    for (const divisor of fractions) {
      it(`when ${box.join(' × ')} Å holds 700 atoms of two types and r_max is the shortest side / ${divisor}, then every type pair's counts equal the brute-force ones exactly`, () => {
        const n = 700, rMax = Math.min(...box) / divisor, nBins = 60;
        const positions = gas(n, box, 3, 100 * b + divisor);
        const brute = histogram('brute-force', positions, n, box, rMax, nBins);
        const cells = histogram('cell-list', positions, n, box, rMax, nBins);
        expect(cells.method).toBe('cell-list');
        expect(Array.from(cells.counts)).toEqual(Array.from(brute.counts));
        // Not an empty comparison: about ρ·(4π/3)r_max³/2 pairs per atom and frame fall inside.
        expect(cells.counts.reduce((s, c) => s + c, 0)).toBeGreaterThan(3 * n);
      });
    }
  }

  it('when one side has 2 cells and another 5 (a 20 × 50 × 31 Å box, r_max 9.9 Å), then the counts equal the brute-force ones exactly', () => {
    const box: Box = [20, 50, 31], rMax = 9.9, n = 900;
    expect(cellCounts(box, rMax, n)).toEqual([2, 5, 3]);
    const positions = gas(n, box, 4, 7);
    expect(Array.from(histogram('cell-list', positions, n, box, rMax, 99).counts)).toEqual(Array.from(histogram('brute-force', positions, n, box, rMax, 99).counts));
  });

  it('when r_max is exactly half of a 2-cell side and a quarter of a 4-cell side (20 × 40 × 25 Å, r_max 10 Å), then the counts equal the brute-force ones exactly', () => {
    const box: Box = [20, 40, 25], rMax = 10, n = 600;
    expect(cellCounts(box, rMax, n)).toEqual([2, 4, 2]);
    const positions = gas(n, box, 4, 8);
    expect(Array.from(histogram('cell-list', positions, n, box, rMax, 50).counts)).toEqual(Array.from(histogram('brute-force', positions, n, box, rMax, 50).counts));
  });

  it('when r_max is a hair above half the shortest side (what the engine lets through as round-off), then that side has one cell and the counts still equal brute force', () => {
    const box: Box = [16, 30, 45], rMax = 8 * (1 + 1e-12), n = 400;
    expect(cellCounts(box, rMax, n)[0]).toBe(1);
    const positions = gas(n, box, 3, 9);
    expect(Array.from(histogram('cell-list', positions, n, box, rMax, 40).counts)).toEqual(Array.from(histogram('brute-force', positions, n, box, rMax, 40).counts));
  });

  it('when atoms crowd into a few cells (a dense clump in a wide box), then the counts equal the brute-force ones exactly', () => {
    const box: Box = [60, 60, 60], rMax = 7, n = 500, rng = new SeededRandom(10);
    const positions = Float32Array.from({ length: 3 * n * 2 }, () => 30 + 4 * rng.normal());
    expect(Array.from(histogram('cell-list', positions, n, box, rMax, 70).counts)).toEqual(Array.from(histogram('brute-force', positions, n, box, rMax, 70).counts));
  });

  it('when r_max is thin in a wide box (0.5 Å in 1000 Å), then the cells are coarsened to at most two per atom, stay at least r_max wide, and the counts equal brute force', () => {
    const box: Box = [1000, 1000, 1000], rMax = 0.5, n = 300;
    const counts = cellCounts(box, rMax, n);
    expect(counts[0] * counts[1] * counts[2]).toBeLessThanOrEqual(MAX_CELLS_PER_ATOM * n);
    counts.forEach((c, k) => expect(box[k]! / c).toBeGreaterThanOrEqual(rMax));
    // Close pairs exist: atoms come in pairs 0.3 Å apart.
    const rng = new SeededRandom(11);
    const positions = new Float32Array(3 * n);
    for (let i = 0; i < n; i += 2) for (let c = 0; c < 3; c++) positions[3 * i + c] = positions[3 * (i + 1) + c] = rng.uniform() * 1000;
    for (let i = 1; i < n; i += 2) positions[3 * i] += 0.3;
    const cells = histogram('cell-list', positions, n, box, rMax, 10);
    expect(cells.counts.reduce((s, c) => s + c, 0)).toBeGreaterThanOrEqual(n / 2);
    expect(Array.from(cells.counts)).toEqual(Array.from(histogram('brute-force', positions, n, box, rMax, 10).counts));
  });
});

describe('which method the automatic choice takes', () => {
  it(`when a system has more than ${BRUTE_FORCE_MAX_ATOMS} atoms, then cell lists are used whatever r_max up to half the box`, () => {
    const box: Box = [22, 22, 22], n = BRUTE_FORCE_MAX_ATOMS + 1;
    const positions = gas(n, box, 1, 12);
    for (const rMax of [11, 11 / 1.5, 5.5, 2]) expect(histogram('auto', positions, n, box, rMax, 20).method).toBe('cell-list');
  });

  it(`when a system has at most ${BRUTE_FORCE_MAX_ATOMS} atoms, then all pairs are visited`, () => {
    const box: Box = [22, 22, 22], n = BRUTE_FORCE_MAX_ATOMS;
    expect(histogram('auto', gas(n, box, 1, 13), n, box, 5, 20).method).toBe('brute-force');
  });

  it('when a 500-atom gas is analysed to the default range (half the box), then the report states cell lists', () => {
    const L = 28.6, rng = new SeededRandom(14);
    const traj = makeTrajectory(500, 2, 1, (_f, _i, out) => out.forEach((_, c) => (out[c] = rng.uniform() * L)), {
      cells: Float64Array.from({ length: 18 }, (_, k) => (k % 9 === 0 || k % 9 === 4 || k % 9 === 8 ? L : 0)), boundary: 'periodic',
    });
    const result = rdf(traj);
    expect(result.rMaxA).toBeCloseTo(L / 2, 12);
    expect(result.method).toBe('cell-list');
  });
});

/**
 * Independent reference: scipy.spatial.cKDTree with periodic `boxsize`
 * counts the pairs within each bin edge (minimum image by its own code).
 * `npm test` installs numpy and scipy where it can; elsewhere this is
 * skipped, saying why.
 */
const reference = referencePythonState();
if (reference.kind !== 'ready') console.warn(`cKDTree cross-check of g(r) counts skipped: ${reference.reason}`);

describe.skipIf(reference.kind !== 'ready')('g(r) pair counts against scipy cKDTree', () => {
  const interpreter = reference.kind === 'ready' ? reference.interpreter : 'python3';
  const script = [
    'import sys, json, numpy as np',
    'from scipy.spatial import cKDTree',
    'd = json.load(sys.stdin)',
    'box = np.array(d["box"], dtype=float)',
    'x = np.mod(np.array(d["positions"], dtype=float).reshape(-1, 3), box)',
    'x = np.where(x >= box, x - box, x)',
    'edges = np.array(d["edges"], dtype=float)',
    't = cKDTree(x, boxsize=box)',
    'ordered = t.count_neighbors(t, edges, cumulative=True)',
    'print(json.dumps(((ordered - len(x)) // 2).tolist()))',
  ].join('\n');

  for (const [box, rMaxOf] of [[[24.5, 31.0, 52.3], 'half'], [[24.5, 31.0, 52.3], 'quarter'], [[27.0, 27.0, 27.0], 'half']] as const) {
    it(`when 1500 atoms fill ${box.join(' × ')} Å and r_max is ${rMaxOf} the shortest side, then the cell-list counts within every bin edge equal cKDTree's`, () => {
      const n = 1500, nBins = 40, b = [...box] as Box;
      const rMax = Math.min(...b) / (rMaxOf === 'half' ? 2 : 4);
      const positions = gas(n, b, 1, Math.round(rMax * 100));
      const h = new PairHistogram(n, new Int32Array(n), Int32Array.from([0]), 1, nBins, rMax, 'auto');
      const counts = new Float64Array(nBins);
      h.addFrame(positions, 0, b, counts);
      expect(h.lastMethod).toBe('cell-list');
      const edges = Array.from({ length: nBins }, (_, k) => ((k + 1) * rMax) / nBins);
      // The last bin ends where the histogram stops counting: r² < r_max²·(1 − R_MAX_ROUNDOFF).
      edges[nBins - 1] = rMax * Math.sqrt(1 - R_MAX_ROUNDOFF);
      const run = spawnSync(interpreter, ['-c', script], { input: JSON.stringify({ box: b, positions: Array.from(positions), edges }), encoding: 'utf8', maxBuffer: 16 << 20 });
      if (run.status !== 0) throw new Error(run.stderr);
      const expected = JSON.parse(run.stdout) as number[];
      let cumulative = 0;
      const ours = Array.from(counts, (c) => (cumulative += c));
      expect(ours).toEqual(expected);
      expect(ours[nBins - 1]).toBeGreaterThan(n);
    });
  }
});
