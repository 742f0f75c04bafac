/**
 * Coordinates kept in a scratch file (atom chunks for MSD, VACF, VDOS, α₂;
 * frame blocks for thermo, g(r), energy) give the same results as the
 * whole arrays in memory: the same Float32 values summed in the same order.
 * Blocks and chunks are made tiny so that every seam is crossed many times.
 */
import { mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { ANALYSIS_KEYS, runAnalyses, type AnalysisRun } from '../../../server/analysis/index.ts';
import type { Trajectory } from '../../../server/analysis/trajectory.ts';
import { assembleTrajectory, type AssembleSpill } from '../../../server/formats/assemble.ts';
import type { Frame } from '../../../server/formats/frame.ts';
import { BlockFileReader } from '../../../server/out-of-core/block-file.ts';
import { SeededRandom } from '../../../server/simulate/random.ts';
import { simulateLennardJones } from '../../../server/simulate/lennard-jones.ts';

const scratch = mkdtempSync(join(tmpdir(), 'ergodic-out-of-core-'));
afterAll(() => rmSync(scratch, { recursive: true, force: true }));

const UNITS = { length: 'angstrom', time: 'ps', velocity: 'angstrom/ps' } as const;

/** A random periodic run of two species: wandering positions (wrapped into the box), random velocities, a breathing cell. */
function randomFrames(nAtoms: number, nFrames: number, seed: number, withVelocities: boolean): Frame[] {
  const rng = new SeededRandom(seed);
  const species = Array.from({ length: nAtoms }, (_, i) => (i % 3 === 0 ? 'O' : 'H'));
  const r = Float64Array.from({ length: 3 * nAtoms }, () => rng.uniform() * 12);
  const frames: Frame[] = [];
  for (let f = 0; f < nFrames; f++) {
    const L = 12 + 0.05 * Math.sin(f / 7);
    const positions = new Float64Array(3 * nAtoms);
    for (let k = 0; k < 3 * nAtoms; k++) {
      r[k] += 0.3 * rng.normal();
      positions[k] = r[k] - L * Math.floor(r[k] / L);
    }
    const cell = Float64Array.from([L, 0, 0, 0, L, 0, 0, 0, L]);
    const frame: Frame = { index: f, positions, species, cell, time: f * 0.01, values: { energy: rng.normal() } };
    if (withVelocities) frame.velocities = Float64Array.from({ length: 3 * nAtoms }, () => 5 * rng.normal());
    frames.push(frame);
  }
  return frames;
}

function framesOf(t: Trajectory): Frame[] {
  const n3 = 3 * t.nAtoms;
  return Array.from({ length: t.nFrames }, (_, f) => {
    const frame: Frame = { index: f, positions: t.positions.slice(f * n3, (f + 1) * n3), species: t.species, cell: t.cells!.slice(9 * f, 9 * f + 9), time: t.times[f] };
    if (t.velocities) frame.velocities = t.velocities.slice(f * n3, (f + 1) * n3);
    return frame;
  });
}

const tinySpill = (memoryBytes = 0): AssembleSpill => ({ directory: scratch, memoryBytes, sizes: { blockFrames: 7, atomsPerChunk: 5 } });

/** Curves as plain arrays, so toEqual compares every number exactly. */
function plain(run: AnalysisRun): unknown {
  return { summary: run.summary, methods: run.methods, curves: Object.fromEntries(Object.entries(run.curves).map(([k, c]) => [k, { ...c, data: c.data.map((d) => Array.from(d)) }])) };
}

describe('analyses on coordinates kept outside memory', () => {
  it('when a random two-species run with velocities goes to a scratch file, then every analysis matches the in-memory result exactly', async () => {
    const frames = randomFrames(23, 90, 11, true);
    const inMemory = await assembleTrajectory(frames, UNITS);
    const outside = await assembleTrajectory(frames, UNITS, { atoms: 23, frames: 90 }, 'random.extxyz', tinySpill());
    expect(inMemory.blocks).toBeUndefined();
    expect(outside.blocks).toBeDefined();
    expect(outside.positions.length).toBe(0);
    const keys = ANALYSIS_KEYS.filter((k) => k !== 'energy');
    const params = { masses: { O: 15.999, H: 1.008 }, rMaxA: 5 };
    expect(plain(runAnalyses(outside, keys, params))).toEqual(plain(runAnalyses(inMemory, keys, params)));
  });

  it('when a run has no velocities (central differences) and outgrows memory part-way, then the results still match exactly', async () => {
    const frames = randomFrames(17, 64, 5, false);
    const inMemory = await assembleTrajectory(frames, UNITS);
    // No expected count: frames start in memory and move to the scratch file when capacity passes the budget.
    const outside = await assembleTrajectory(frames, UNITS, undefined, 'moving.xyz', tinySpill(17 * 12 * 20));
    expect(outside.blocks).toBeDefined();
    expect(outside.velocities).toBeUndefined();
    const keys = ['thermo', 'msd', 'vacf', 'vdos', 'rdf', 'ngp', 'lindemann'] as const;
    const params = { masses: { O: 15.999, H: 1.008 }, rMaxA: 5 };
    expect(plain(runAnalyses(outside, keys, params))).toEqual(plain(runAnalyses(inMemory, keys, params)));
  });

  it('when a Lennard-Jones liquid with an interaction model goes to a scratch file, then the energy analysis matches too', async () => {
    const traj = simulateLennardJones({ cellsPerSide: 3, reducedDensity: 0.8442, temperatureK: 86.5, equilibrationSteps: 50, productionSteps: 120, sampleEvery: 2, seed: 7 }).trajectory;
    const outside = await assembleTrajectory(framesOf(traj), UNITS, { atoms: traj.nAtoms, frames: traj.nFrames }, 'lj.extxyz', tinySpill());
    const inMemory = await assembleTrajectory(framesOf(traj), UNITS);
    const interactionModel = { pairs: [{ species: ['Ar', 'Ar'] as [string, string], form: 'lj' as const, epsilonEV: 0.0103236, sigmaA: 3.405, cutoffA: 5 }] };
    const params = { masses: { Ar: 39.948 }, interactionModel };
    expect(plain(runAnalyses(outside, ['energy', 'thermo'], params))).toEqual(plain(runAnalyses(inMemory, ['energy', 'thermo'], params)));
  });

  it('when the scratch file is read by atoms or by frames, then each value is the one assembled, across block seams', async () => {
    const frames = randomFrames(11, 30, 3, true);
    const inMemory = await assembleTrajectory(frames, UNITS);
    const outside = await assembleTrajectory(frames, UNITS, { atoms: 11, frames: 30 }, 'seams.extxyz', tinySpill());
    const blocks = outside.blocks as BlockFileReader;
    const atoms = blocks.readAtoms('velocities', 5, 10);
    for (let a = 5; a < 10; a++) {
      for (let t = 0; t < 30; t++) {
        for (let c = 0; c < 3; c++) expect(atoms[(a - 5) * 90 + 3 * t + c]).toBe(inMemory.velocities![33 * t + 3 * a + c]);
      }
    }
    const last = blocks.readFrameBlock('positions', 4);
    expect(Array.from(last)).toEqual(Array.from(inMemory.positions.subarray(33 * 28, 33 * 30)));
  });

  it('when a frame is bad half-way through a spilled run, then the error names it and the scratch file is closed', async () => {
    const dir = mkdtempSync(join(scratch, 'bad-'));
    const frames = randomFrames(5, 20, 9, true);
    delete frames[12]!.velocities;
    await expect(assembleTrajectory(frames, UNITS, { atoms: 5, frames: 20 }, 'bad.extxyz', { ...tinySpill(), directory: dir }))
      .rejects.toThrow(/bad\.extxyz, frame 13: frame has no velocities/);
    // Closed, so the caller can remove its folder; nothing else was left there.
    expect(readdirSync(dir)).toHaveLength(1);
  });
});
