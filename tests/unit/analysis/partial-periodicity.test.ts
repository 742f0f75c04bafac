/**
 * Periodic along some directions only (a slab: pbc="T T F"). Every check has
 * an exact answer: the minimum-image convention applied per lattice direction
 * (Allen & Tildesley, Computer Simulation of Liquids, §1.5 [FROM MEMORY], the
 * usual convention for slabs: images only along the repeating directions),
 * the Einstein relation in d dimensions (SCIENCE item 1), the bulk Lindemann
 * ratio √3·s/r_nn (SCIENCE item 23) and the Lennard-Jones pair energy
 * 4ε[(σ/r)¹² − (σ/r)⁶] (SCIENCE item 9).
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { runAnalyses } from '../../../server/analysis/index.ts';
import { AtomSeriesReader } from '../../../server/analysis/atom-series.ts';
import { cellFramesOf, minimumImage } from '../../../server/analysis/cell-geometry.ts';
import { lindemann } from '../../../server/analysis/lindemann.ts';
import type { Trajectory } from '../../../server/analysis/trajectory.ts';
import { assembleTrajectory } from '../../../server/formats/assemble.ts';
import { openTrajectory } from '../../../server/formats/open-trajectory.ts';
import { SeededRandom } from '../../../server/simulate/random.ts';
import { jitteredFcc } from './known-answer-systems.ts';
import { cubicCells, makeTrajectory } from './synthetic.ts';

const SLAB: [boolean, boolean, boolean] = [true, true, false];
const dir = mkdtempSync(join(tmpdir(), 'ergodic-slab-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Walkers with diffusion coefficient d along x and y, wrapped into an L-wide box there, held in layers along z with a small jitter. */
function slabWalkers(atoms: number, frames: number, dt: number, d: number, L: number, jitter: number, seed: number): Trajectory {
  const rng = new SeededRandom(seed);
  const step = Math.sqrt(2 * d * dt);
  const free = Array.from({ length: atoms }, () => [rng.uniform() * L, rng.uniform() * L]);
  const layer = Array.from({ length: atoms }, (_, i) => 5 + (i % 4) * 3);
  return makeTrajectory(atoms, frames, dt, (f, i, out) => {
    const p = free[i]!;
    if (f > 0 && i === 0) for (const q of free) (q[0] += step * rng.normal()), (q[1] += step * rng.normal());
    out[0] = ((p[0]! % L) + L) % L;
    out[1] = ((p[1]! % L) + L) % L;
    out[2] = layer[i]! + jitter * rng.normal();
  }, { cells: cubicCells(frames, L), boundary: 'periodic', periodicAxes: SLAB });
}

describe('minimum image and unwrapping along the periodic directions only', () => {
  it('when two atoms sit at opposite corners of a 10 Å slab cell, then x and y take the near image (−2 Å) and z keeps the real 8 Å', () => {
    const traj = makeTrajectory(2, 1, 1, () => {}, { cells: cubicCells(1, 10), boundary: 'periodic', periodicAxes: SLAB });
    const d = Float64Array.of(8, 8, 8);
    minimumImage(cellFramesOf(traj)!, 0, d);
    expect([...d].map((v) => Math.round(v * 1e12) / 1e12)).toEqual([-2, -2, 8]);
  });

  it('when an atom moves +3 Å a frame along x (wrapped) and +6 Å a frame along z, then x unwraps to 1 + 3f and z is left as it is (a full wrap would read −4 Å steps)', () => {
    const traj = makeTrajectory(1, 4, 0.1, (f, _i, out) => {
      out[0] = (1 + 3 * f) % 10;
      out[1] = 5;
      out[2] = 1 + 6 * f;
    }, { cells: cubicCells(4, 10), boundary: 'periodic', periodicAxes: SLAB });
    const series = new AtomSeriesReader(traj, Float64Array.of(39.948), false).unwrapped(0, new Float64Array(12));
    expect([...series.subarray(0, 4)].map((v) => Math.round(v * 1e4) / 1e4)).toEqual([1, 4, 7, 10]);
    expect([...series.subarray(8, 12)]).toEqual([1, 7, 13, 19]);
    const whole = new AtomSeriesReader({ ...traj, periodicAxes: undefined }, Float64Array.of(39.948), false).unwrapped(0, new Float64Array(12));
    expect([...whole.subarray(8, 12)]).toEqual([1, -3, -7, -11]);
  });
});

describe('a slab: MSD per direction, D from the periodic ones, g(r) refused', () => {
  const D = 0.5;
  const traj = slabWalkers(256, 400, 0.05, D, 20, 0.1, 7);
  const run = runAnalyses(traj, ['msd', 'rdf', 'sq', 'thermo'], { removeComDrift: false });

  it('when walkers diffuse with D = 0.5 Å²/ps along x and y and stay in their layers along z, then D is taken from x and y (MSD = 4Dt) and equals 0.5 within 5 % and within 3 stated errors', () => {
    const msd = run.summary.msd!;
    expect(msd.components).toBe('xy');
    expect(msd.dimensions).toBe(2);
    expect(msd.partlyPeriodic?.periodicAxes).toBe('xy');
    expect(msd.partlyPeriodic?.note).toMatch(/Periodic along x, y only: D from the 2-dimensional MSD along x, y.*z, which does not repeat, is shown on its own/);
    const all = msd.groups[0]!;
    expect(Math.abs(all.d!.a2PerPs / D - 1)).toBeLessThan(0.05);
    expect(Math.abs(all.d!.a2PerPs - D)).toBeLessThan(3 * all.dStdError!.a2PerPs);
  });

  it('when the MSD is drawn, then each direction has its own curve: x and y grow as 2Dt, z levels off at 2·(0.1 Å)² = 0.02 Å²', () => {
    const c = run.curves.msd!;
    const column = (name: string) => c.data[c.columns.indexOf(name)]!;
    const lag = column('lag');
    const k = 100;
    expect(column('MSD along x')[k]! / (2 * D * lag[k]!)).toBeCloseTo(1, 1);
    expect(column('MSD along y')[k]! / (2 * D * lag[k]!)).toBeCloseTo(1, 1);
    expect(column('MSD along z')[k]!).toBeCloseTo(0.02, 2);
  });

  it('when g(r) and S(q) are asked for, then they are refused saying why, and the other analyses of the run are still there', () => {
    expect(run.summary.rdf).toEqual({ pairs: [], refused: expect.stringMatching(/not computed for a system periodic along x and y only.*along z this one is bounded by walls or vacuum/) });
    expect(run.summary.sq?.refused).toMatch(/periodic along x and y only/);
    expect(run.curves.rdf).toBeUndefined();
    expect(run.summary.thermo).toBeDefined();
  });

  it('when the thermo analysis meets a slab, then it gives no density, saying the cell is not the volume the atoms fill', () => {
    expect(run.summary.thermo!.densityGPerCm3).toBeNull();
    expect(run.summary.thermo!.warnings).toContainEqual(expect.stringMatching(/No density: .*periodic along x and y only/));
  });
});

describe('Lindemann index of a crystal slab (SCIENCE item 23)', () => {
  it('when an FCC slab jitters with s = 0.1 Å, its atoms wrapped along x and y and a vacuum gap along z, then the per-atom index is √3·s/r_nn within 5 %', () => {
    const a = 5.26, s = 0.1, cells = 6, L = cells * a;
    const crystal = jitteredFcc(cells, a, s, 40, 3);
    const positions = crystal.positions.map((v, k) => (k % 3 === 2 ? v : ((v % L) + L) % L));
    const cellsArray = crystal.cells!.map((v, k) => (k % 9 === 8 ? 3 * L : v));
    const r = lindemann({ ...crystal, positions, cells: cellsArray, periodicAxes: SLAB });
    expect(r.form).toBe('per-atom');
    expect(Math.abs(r.index / ((Math.sqrt(3) * s) / (a / Math.SQRT2)) - 1)).toBeLessThan(0.05);
  });
});

describe('pair energy of a slab: images only along the periodic directions (SCIENCE item 9)', () => {
  const sigma = 1, epsilon = 0.01;
  const model = { pairs: [{ species: ['Ar', 'Ar'] as [string, string], form: 'lj' as const, epsilonEV: epsilon, sigmaA: sigma, cutoffA: 3 }] };
  const u = (r: number) => 4 * epsilon * ((sigma / r) ** 12 - (sigma / r) ** 6);
  const pair = (a: number[], b: number[], periodicAxes?: [boolean, boolean, boolean]) => {
    const traj = makeTrajectory(2, 4, 0.01, (_f, i, out) => out.set(i === 0 ? a : b), { cells: cubicCells(4, 10), boundary: 'periodic', periodicAxes });
    return runAnalyses(traj, ['energy'], { interactionModel: model }).summary.energy!;
  };

  // Positions are stored as 32-bit floats, so 9.4 Å carries ~1e-7 Å of rounding: agreement to 1e-7 eV.
  it('when two atoms 1.2 Å apart through the x boundary, then the slab counts that image: U = u(1.2 Å) for the two atoms', () => {
    expect(pair([0.6, 5, 5], [9.4, 5, 5], SLAB).potentialPerAtomEV!.mean * 2).toBeCloseTo(u(1.2), 7);
  });

  it('when the same two atoms face each other through the z boundary, then the slab counts nothing (8.8 Å apart, beyond the cut-off) while a bulk cell counts u(1.2 Å)', () => {
    expect(pair([5, 5, 0.6], [5, 5, 9.4], SLAB).potentialPerAtomEV!.mean).toBe(0);
    expect(pair([5, 5, 0.6], [5, 5, 9.4]).potentialPerAtomEV!.mean * 2).toBeCloseTo(u(1.2), 7);
  });

  it('when the system is a slab, then no virial pressure and no tail correction are given, since the cell is not the volume it fills', () => {
    const e = pair([0.6, 5, 5], [9.4, 5, 5], SLAB);
    expect(e.pressureBar ?? null).toBeNull();
  });
});

describe('reading which directions repeat', () => {
  async function assembled(comments: string[]) {
    const path = join(dir, `f${comments.length}-${comments[0]!.length}.extxyz`);
    writeFileSync(path, comments.map((c, f) => `1\n${c} Time=${f * 0.1}\nAr 1 2 ${3 + f}\n`).join(''));
    const opened = await openTrajectory(path, 'slab.extxyz');
    return assembleTrajectory(opened.frames, { length: 'angstrom', time: 'ps', velocity: 'angstrom/ps' }, undefined, 'slab.extxyz');
  }
  const lattice = 'Lattice="10 0 0 0 10 0 0 0 10" Properties=species:S:1:pos:R:3';

  it('when an extended XYZ says pbc="T T F", then the trajectory is periodic along x and y only', async () => {
    const t = await assembled([`${lattice} pbc="T T F"`, `${lattice} pbc="T T F"`]);
    expect(t.boundary).toBe('periodic');
    expect(t.periodicAxes).toEqual([true, true, false]);
  });

  it('when it has a lattice and no pbc, then all three repeat (the extended XYZ default)', async () => {
    const t = await assembled([lattice, lattice]);
    expect(t.boundary).toBe('periodic');
    expect(t.periodicAxes).toBeUndefined();
  });

  it('when it says pbc="F F F", then nothing repeats even with the metadata default "periodic"', async () => {
    const path = join(dir, 'open.extxyz');
    writeFileSync(path, [0, 1].map((f) => `1\n${lattice} pbc="F F F" Time=${f * 0.1}\nAr 1 2 3\n`).join(''));
    const opened = await openTrajectory(path, 'open.extxyz');
    const t = await assembleTrajectory(opened.frames, { length: 'angstrom', time: 'ps', velocity: 'angstrom/ps', boundary: 'periodic' }, undefined, 'open.extxyz');
    expect(t.boundary).toBe('none');
  });

  it('when the periodic directions change between frames, then reading stops naming the frame and both settings', async () => {
    await expect(assembled([`${lattice} pbc="T T F"`, `${lattice} pbc="T T T"`])).rejects.toThrow(/periodic directions change from pbc="T T F" to pbc="T T T"/);
  });
});
