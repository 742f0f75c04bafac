import { describe, expect, it } from 'vitest';
import { runAnalyses } from '../../../server/analysis/index.ts';
import type { Trajectory } from '../../../server/analysis/trajectory.ts';
import { estimateCost, NS_PER_UNIT } from '../../../server/run-plan/cost-estimate.ts';
import { adviceFor, ParamOutOfBounds, planRun, PlanProblem, type TrajectoryFacts } from '../../../server/run-plan/plan-run.ts';
import { boundedRMaxA, DEFAULT_SPHERE_ATOMS, defaultRMaxA, SHRINK_ALLOWANCE } from '../../../server/run-plan/rdf-range.ts';
import { fccLattice } from '../../../server/simulate/fcc-lattice.ts';
import { AUTO_STRIDE_MAX_FRAMES, selectFrames } from '../../../shared/frame-selection.ts';

const cube = (l: number) => [l, 0, 0, 0, l, 0, 0, 0, l];
const facts = (over: Partial<TrajectoryFacts> = {}): TrajectoryFacts => ({ atoms: 500, frames: 4000, framePs: 0.01, hasVelocities: true, cell: cube(28.6), ...over });

describe('which frames an analysis uses', () => {
  it('when a range, a stride and an equilibration discard are given, then the discard is cut from the start of the range in whole frames', () => {
    const s = selectFrames(4000, 0.01, { fromFrame: 100, toFrame: 3100, frameStride: 5, discardPs: 2.004 });
    expect(s).toEqual({ from: 301, to: 3100, stride: 5, discardFrames: 201, frames: 560, autoStride: false });
  });

  it('when a run is longer than the automatic limit and no stride is given, then every k-th frame keeps it within the limit', () => {
    const s = selectFrames(1_000_001, 0.001, {});
    expect('problem' in s).toBe(false);
    if ('problem' in s) return;
    expect(s.stride).toBe(11);
    expect(s.frames).toBeLessThanOrEqual(AUTO_STRIDE_MAX_FRAMES);
    expect(s.autoStride).toBe(true);
    expect(selectFrames(1_000_001, 0.001, { frameStride: 1 })).toMatchObject({ stride: 1, frames: 1_000_001, autoStride: false });
  });

  it.each([
    [{ fromFrame: 4000 }, /fromFrame 4000 is past the last frame \(the trajectory has 4000 frames/],
    [{ toFrame: 4001 }, /toFrame 4001 is past the end/],
    [{ fromFrame: 10, toFrame: 10 }, /toFrame \(10\) must be greater than fromFrame \(10\)/],
    [{ discardPs: 40 }, /Discarding 40 ps \(4000 frames\) leaves none of the 4000 frames chosen/],
    [{ toFrame: 3, frameStride: 2, fromFrame: 2 }, /leaves 1 frame; analyses need at least 2/],
  ])('when the selection is %j, then it is refused in words that say what to change', (input, message) => {
    const s = selectFrames(4000, 0.01, input);
    expect('problem' in s && s.problem).toMatch(message);
    expect(() => planRun(facts(), ['msd'], input)).toThrow(PlanProblem);
  });
});

describe('the default range of g(r)', () => {
  it('when no rMaxA is given, then the 20 000-bin limit holds for the default range, half the shortest cell width', () => {
    // 500 atoms keep the textbook range: a 250 Å box gives r_max 125 Å, 25 000 bins of 0.005 Å.
    const wide = facts({ cell: [250, 0, 0, 0, 260, 0, 0, 0, 270] });
    const refuse = () => planRun(wide, ['rdf'], { binWidthA: 0.005 });
    expect(refuse).toThrow(ParamOutOfBounds);
    expect(refuse).toThrow(/^binWidthA: the default range \(half the shortest cell width, 125 Å\) in bins of 0.005 Å makes 25000 bins, more than 20000: use bins of at least 0.007 Å or give a shorter rMaxA/);
    expect(() => planRun(wide, ['sq'], { binWidthA: 0.005 })).toThrow(ParamOutOfBounds);
    // The advised width, a shorter range, or an analysis without g(r) all pass.
    expect(planRun(wide, ['rdf'], { binWidthA: 0.007 }).params.rMaxA).toBeUndefined();
    expect(planRun(wide, ['rdf'], { binWidthA: 0.005, rMaxA: 100 }).params.rMaxA).toBe(100);
    expect(() => planRun(wide, ['msd'], { binWidthA: 0.005 })).not.toThrow();
    // Exactly at the limit is allowed: 100 Å / 0.005 Å = 20 000 bins.
    expect(() => planRun(facts({ cell: cube(200) }), ['rdf'], { binWidthA: 0.005 })).not.toThrow();
  });

  it('when a large system gets the bounded default range, then its bins are counted on that range', () => {
    const l = Math.cbrt(50_000 / 0.021);
    expect(() => planRun(facts({ atoms: 50_000, cell: cube(l) }), ['rdf'], { binWidthA: 0.005 })).not.toThrow();
  });

  // The rule: r_max = min(half the shortest width, radius of the sphere holding DEFAULT_SPHERE_ATOMS at the mean density).
  const sphereAtoms = (r: number, atoms: number, l: number) => (4 / 3) * Math.PI * r ** 3 * (atoms / l ** 3);

  it('when 500 atoms fill a liquid-density cube, then the sphere of a thousand atoms is wider than half the cell and g(r) keeps half the cell', () => {
    const l = 28.6;
    expect(boundedRMaxA(500, cube(l))).toBeCloseTo(l / 2, 12);
    // Left to the engine, which takes half the shortest width over every frame.
    expect(defaultRMaxA(500, cube(l))).toBeUndefined();
    expect(planRun(facts(), ['rdf'], {}).params.rMaxA).toBeUndefined();
  });

  it('when 2000 atoms fill a cube at 0.021 Å⁻³, then the sphere (0.985 of half the cell) is within the shrink allowance and half the cell is kept', () => {
    const l = Math.cbrt(2000 / 0.021);
    const bounded = boundedRMaxA(2000, cube(l))!;
    expect(sphereAtoms(bounded, 2000, l)).toBeCloseTo(DEFAULT_SPHERE_ATOMS, 6);
    expect(bounded / (l / 2)).toBeCloseTo(0.985, 3);
    expect(bounded).toBeGreaterThan(SHRINK_ALLOWANCE * (l / 2));
    expect(defaultRMaxA(2000, cube(l))).toBeUndefined();
  });

  it('when 3000 atoms fill a cube, then the range is the sphere of a thousand atoms even though it is wider than a third of the cell', () => {
    const l = Math.cbrt(3000 / 0.021);
    const r = defaultRMaxA(3000, cube(l))!;
    expect(r).toBeGreaterThan(l / 3);
    expect(r).toBeLessThan(SHRINK_ALLOWANCE * (l / 2));
    expect(sphereAtoms(r, 3000, l)).toBeCloseTo(DEFAULT_SPHERE_ATOMS, 6);
  });

  it('when 100 000 atoms fill a cube, then the range is the radius holding about a thousand atoms and the plan records it', () => {
    const l = Math.cbrt(100_000 / 0.021);
    const r = defaultRMaxA(100_000, cube(l))!;
    expect(sphereAtoms(r, 100_000, l)).toBeCloseTo(DEFAULT_SPHERE_ATOMS, 6);
    // (3·1000/(4π·0.021))^⅓ = 22.485 Å, whatever the size of the cell.
    expect(r).toBeCloseTo(22.485, 3);
    const big = facts({ atoms: 100_000, cell: cube(l) });
    expect(planRun(big, ['rdf'], {}).params.rMaxA).toBeCloseTo(r, 4);
    expect(planRun(big, ['sq'], {}).params.rMaxA).toBeCloseTo(r, 4);
    // A range the user gives is kept.
    expect(planRun(big, ['rdf'], { rMaxA: 12 }).params.rMaxA).toBe(12);
  });

  it('when the cell is a slab (one short side), then half that side bounds the range', () => {
    const slab = [30, 0, 0, 0, 300, 0, 0, 0, 300];
    expect(boundedRMaxA(200_000, slab)).toBeCloseTo(Math.cbrt((3 * 1000 * 30 * 300 * 300) / (4 * Math.PI * 200_000)), 9);
    expect(boundedRMaxA(20_000, slab)).toBe(15);
    expect(defaultRMaxA(20_000, slab)).toBeUndefined();
  });

  it('when a 3000-atom crystal is analysed with the defaults, then g(r) runs on cell lists', () => {
    const a = 5.26, cells = 9;
    const base = fccLattice(cells, a);
    const n = base.length / 3, box = cells * a, frames = 3;
    const positions = new Float32Array(frames * base.length);
    for (let f = 0; f < frames; f++) positions.set(base, f * base.length);
    const traj: Trajectory = {
      nAtoms: n, nFrames: frames, species: new Array<string>(n).fill('Ar'), positions,
      cells: Float64Array.from({ length: 9 * frames }, (_, k) => cube(box)[k % 9]!), times: Float64Array.from([0, 0.01, 0.02]), boundary: 'periodic',
    };
    const plan = planRun(facts({ atoms: n, frames, cell: cube(box) }), ['rdf'], {});
    const run = runAnalyses(traj, ['rdf'], plan.params);
    expect((run.methods.rdf as { method: string }).method).toBe('cell-list');
    // FCC nearest neighbours at a/√2 (lattice geometry): the first peak sits there.
    expect(run.summary.rdf!.pairs[0]!.firstPeak!.rA).toBeCloseTo(a / Math.SQRT2, 1);
  });
});

describe('the cost estimate', () => {
  it('when frames double, then the time of a per-frame analysis about doubles, and memory grows with the frames held', () => {
    const budget = 1024 ** 3;
    const one = estimateCost(['rdf', 'thermo'], { atoms: 5000, frames: 1000, hasVelocities: true, volumePerAtomA3: 47, rMaxA: 10, halfWidthA: 30, cutoffA: null, inMemoryBytes: budget });
    const two = estimateCost(['rdf', 'thermo'], { atoms: 5000, frames: 2000, hasVelocities: true, volumePerAtomA3: 47, rMaxA: 10, halfWidthA: 30, cutoffA: null, inMemoryBytes: budget });
    expect(two.seconds / one.seconds).toBeGreaterThan(1.8);
    expect(two.seconds / one.seconds).toBeLessThan(2.2);
    // Coordinates, 24 bytes per atom with velocities, and the time and cell of each frame (80).
    expect(two.memoryBytes - one.memoryBytes).toBeCloseTo(1000 * (5000 * 24 + 80), -3);
    expect([one.scratchBytes, two.scratchBytes]).toEqual([0, 0]);
  });

  it('when the coordinates outgrow the in-memory budget, then memory stays bounded as the run grows tenfold and the scratch file on disk takes the frames', () => {
    const budget = 96 * 1024 ** 2;
    const run = (frames: number) => estimateCost(['msd', 'vacf', 'vdos', 'rdf'], { atoms: 5000, frames, hasVelocities: true, volumePerAtomA3: 47, rMaxA: 10, halfWidthA: 30, cutoffA: null, inMemoryBytes: budget });
    const long = run(10_000);
    const longer = run(100_000);
    // The whole run would be 5000 atoms × 24 bytes × 100 000 frames = 12 GB; what is held is a block and an atom chunk, plus per-frame series.
    expect(longer.scratchBytes).toBe(5000 * 24 * 100_000);
    expect(long.scratchBytes).toBe(5000 * 24 * 10_000);
    expect(longer.memoryBytes).toBeLessThan(600 * 1024 ** 2);
    expect(longer.memoryBytes / long.memoryBytes).toBeLessThan(2);
    // Within the budget nothing goes to disk.
    expect(run(100).scratchBytes).toBe(0);
  });

  it('when a site limits memory, then a run whose coordinates exceed that limit is still within it, because it works from its scratch file', () => {
    const big = facts({ atoms: 20_000, frames: 20_000, hasVelocities: true, cell: cube(Math.cbrt(20_000 / 0.021)) });
    const plan = planRun(big, ['msd', 'vacf'], {}, 96 * 1024 ** 2);
    expect(plan.estimate.scratchBytes).toBe(20_000 * 24 * 20_000);
    expect(plan.estimate.memoryBytes).toBeLessThan(4 * 1024 ** 3);
    expect(plan.estimate.scratchBytes).toBeGreaterThan(4 * 1024 ** 3);
  });

  it('when g(r) of a large system runs to half the cell, then it costs far more than with the bounded default range', () => {
    const l = Math.cbrt(50_000 / 0.021);
    const big = facts({ atoms: 50_000, frames: 1000, cell: cube(l) });
    const bounded = planRun(big, ['rdf'], {}).estimate.seconds;
    const half = planRun(big, ['rdf'], { rMaxA: l / 2 }).estimate.seconds;
    expect(half / bounded).toBeGreaterThan(5);
  });

  it('when g(r) runs to half the cell, then its cell lists (two a side) visit every pair and the estimate prices them all, half of them binned', () => {
    const n = 4000, l = Math.cbrt(n / 0.021), frames = 10;
    const e = estimateCost(['rdf'], { atoms: n, frames, hasVelocities: false, volumePerAtomA3: l ** 3 / n, rMaxA: null, halfWidthA: l / 2, cutoffA: null });
    const all = (n * (n - 1)) / 2, binned = (n * (Math.PI / 6) * n) / 2;
    expect(e.analyses[0]!.seconds).toBeCloseTo((frames * (all * NS_PER_UNIT.rdfPair + binned * NS_PER_UNIT.rdfBinned)) / 1e9, 9);
  });

  it('when g(r) of a large system runs to half the cell past the limits, then the advice names the sphere radius and the speed-up it gives, and the plan with it bears that out', () => {
    const l = Math.cbrt(20_000 / 0.021);
    const big = facts({ atoms: 20_000, frames: 2000, cell: cube(l) });
    const plan = planRun(big, ['rdf'], { rMaxA: l / 2 });
    const advice = adviceFor(plan, big, ['rdf'], { seconds: plan.estimate.seconds / 10, memoryBytes: 64 * 1024 ** 3 });
    const match = /Use a smaller g\(r\) range: r_max ≤ ([\d.]+) Å \(about 1000 atoms within it\) makes g\(r\) about (\d+)× faster\./.exec(advice.join(' '));
    expect(match).not.toBeNull();
    const [advised, speedup] = [Number(match![1]), Number(match![2])];
    expect(advised).toBeLessThanOrEqual(boundedRMaxA(20_000, cube(l))!);
    expect(advised).toBeGreaterThan(0.99 * boundedRMaxA(20_000, cube(l))!);
    const rdfSeconds = (p: ReturnType<typeof planRun>) => p.estimate.analyses.find((a) => a.key === 'rdf')!.seconds;
    expect(rdfSeconds(plan) / rdfSeconds(planRun(big, ['rdf'], { rMaxA: advised }))).toBeCloseTo(speedup, -0.5);
  });

  it('when a small system runs g(r) to half its cell, then no smaller range is advised (half the cell is already inside the sphere of a thousand atoms)', () => {
    const small = facts({ frames: 4_000_000 });
    const plan = planRun(small, ['rdf'], { frameStride: 1 });
    const advice = adviceFor(plan, small, ['rdf'], { seconds: plan.estimate.seconds / 10, memoryBytes: 64 * 1024 ** 3 });
    expect(advice.length).toBeGreaterThan(0);
    expect(advice.join(' ')).not.toMatch(/g\(r\) range/);
  });

  it('when a run is past the limits, then each piece of advice names a change that brings it under them on its own', () => {
    const big = facts({ atoms: 20_000, frames: 200_000, hasVelocities: true, cell: cube(Math.cbrt(20_000 / 0.021)) });
    const analyses = ['msd', 'vacf', 'rdf'] as const;
    const plan = planRun(big, [...analyses], { frameStride: 1 });
    const limits = { seconds: plan.estimate.seconds / 10, memoryBytes: 64 * 1024 ** 3 };
    const advice = adviceFor(plan, big, [...analyses], limits);
    const stride = Number(/frame stride (\d+)/.exec(advice.join(' '))?.[1]);
    expect(stride).toBeGreaterThan(1);
    expect(planRun(big, [...analyses], { frameStride: stride }).estimate.seconds).toBeLessThanOrEqual(limits.seconds);
    const toFrame = Number(/at most (\d+) frames at stride 1\./.exec(advice.join(' '))?.[1]);
    expect(planRun(big, [...analyses], { frameStride: 1, toFrame }).estimate.seconds).toBeLessThanOrEqual(limits.seconds);
  });
});
