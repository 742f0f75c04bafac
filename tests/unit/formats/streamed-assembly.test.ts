/**
 * Reading as the command line reads: frames whose arrays are refilled
 * (transient frames), arrays sized once from the input's size, and comment
 * lines whose Properties= and Lattice= are remembered between frames. Each
 * must give exactly what the plain path gives.
 */
import { describe, expect, it } from 'vitest';
import { assembleTrajectory, type AssembleHints } from '../../../server/formats/assemble.ts';
import { handBackArrays, type Frame } from '../../../server/formats/frame.ts';
import { openTrajectory } from '../../../server/formats/open-trajectory.ts';
import type { Trajectory } from '../../../server/analysis/trajectory.ts';
import { writeFile } from 'node:fs/promises';
import { inspectTrajectory } from '../../../server/formats/inspect.ts';
import { bytes, chunked, extxyzText, gzip, makeSystem, readAll, tempDir, xyzText } from './synthetic.ts';

const UNITS = { length: 'nm', time: 'ps', velocity: 'nm/ps' } as const;

async function assembled(text: Uint8Array, name: string, transientFrames: boolean, hints?: AssembleHints): Promise<Trajectory> {
  const opened = await openTrajectory(chunked(text, [1, 7, 64, 4093]), name, { transientFrames });
  return assembleTrajectory(opened.frames, { ...UNITS, timeStepPs: 0.5 }, undefined, name, undefined, hints);
}

function same(a: Trajectory, b: Trajectory): void {
  expect(b.nFrames).toBe(a.nFrames);
  expect(b.positions).toEqual(a.positions);
  expect(b.velocities).toEqual(a.velocities);
  expect(b.cells).toEqual(a.cells);
  expect(b.times).toEqual(a.times);
  expect(b.species).toEqual(a.species);
  expect(b.boundary).toBe(a.boundary);
}

describe('transient frames', () => {
  const system = makeSystem(7, 9, 11, { cellChanges: true });
  const text = bytes(extxyzText(system));

  it('when frames are transient, then one pair of arrays is refilled and each frame holds its own values when it arrives', async () => {
    const opened = await openTrajectory(chunked(text), 'run.extxyz', { transientFrames: true });
    const arrays = new Set<Frame['positions']>();
    for await (const frame of opened.frames) {
      arrays.add(frame.positions).add(frame.velocities!);
      expect(Array.from(frame.positions)).toEqual(Array.from(system.positions[frame.index]!));
      expect(Array.from(frame.velocities!)).toEqual(Array.from(system.velocities[frame.index]!));
    }
    expect(arrays.size).toBe(2);
  });

  it('when frames are not transient, then every frame keeps arrays of its own', async () => {
    const frames = await readAll(text, 'run.extxyz');
    expect(new Set(frames.map((f) => f.positions)).size).toBe(9);
    expect(Array.from(frames[0]!.positions)).toEqual(Array.from(system.positions[0]!));
  });

  it('when velocities appear only from the second frame on, then the refilled arrays follow the columns', async () => {
    const [first, ...rest] = extxyzText(system).split(/(?=^7\n)/m);
    const withoutVelocities = first!.replace('pos:R:3:velo:R:3', 'pos:R:3').replace(/^([A-Z][a-z]? \S+ \S+ \S+) .*$/gm, '$1');
    const opened = await openTrajectory(chunked(bytes(withoutVelocities + rest.join(''))), 'run.extxyz', { transientFrames: true });
    const seen: boolean[] = [];
    for await (const frame of opened.frames) {
      seen.push(frame.velocities !== undefined);
      expect(Array.from(frame.positions)).toEqual(Array.from(system.positions[frame.index]!));
      if (frame.velocities) expect(Array.from(frame.velocities)).toEqual(Array.from(system.velocities[frame.index]!));
    }
    expect(seen).toEqual([false, true, true, true, true, true, true, true, true]);
  });
});

describe('frames handed back', () => {
  const system = makeSystem(7, 9, 11, { cellChanges: true });
  const text = bytes(extxyzText(system));

  it('when each frame is handed back once read, then the next frame refills its arrays with its own values', async () => {
    const opened = await openTrajectory(chunked(text), 'run.extxyz');
    const arrays = new Set<Frame['positions']>();
    for await (const frame of opened.frames) {
      arrays.add(frame.positions).add(frame.velocities!);
      expect(Array.from(frame.positions)).toEqual(Array.from(system.positions[frame.index]!));
      expect(Array.from(frame.velocities!)).toEqual(Array.from(system.velocities[frame.index]!));
      handBackArrays(frame);
    }
    expect(arrays.size).toBe(2);
  });

  it('when assembly hands frames back, then the trajectory equals one from frames kept apart', async () => {
    const kept = (await readAll(text, 'run.extxyz')).map((frame) => ({ ...frame }));
    const fromKept = await assembleTrajectory(kept, { ...UNITS, timeStepPs: 0.5 }, undefined, 'run.extxyz');
    same(fromKept, await assembled(text, 'run.extxyz', false));
  });
});

describe('files read into reused buffers', () => {
  // Several one-megabyte reads, so the read buffers are handed back and refilled many times over.
  const system = makeSystem(400, 280, 13, { cellChanges: true });
  const text = bytes(extxyzText(system));

  it('given a file of several read buffers, when it is inspected and assembled from its path, then both equal a reading of the same bytes in odd chunks', async () => {
    expect(text.length).toBeGreaterThan(4 << 20);
    const dir = await tempDir();
    try {
      const path = dir.file('run.extxyz');
      await writeFile(path, text);
      const info = await inspectTrajectory(path, 'run.extxyz');
      const streamed = await inspectTrajectory(chunked(text, [70_001, 4093]), 'run.extxyz', { totalBytes: text.length });
      expect(info).toEqual(streamed);
      const opened = await openTrajectory(path, 'run.extxyz');
      const fromPath = await assembleTrajectory(opened.frames, { ...UNITS, timeStepPs: 0.5 }, { atoms: info.atoms, frames: info.frames }, 'run.extxyz');
      same(await assembled(text, 'run.extxyz', false), fromPath);
      expect(Array.from(fromPath.positions.subarray(-3 * 400))).toEqual(Array.from(system.positions[279]!, (x) => Math.fround(x * 10)));
    } finally {
      await dir.remove();
    }
  });

  it('given a gzip file, when it is read from its path, then its frames equal the plain file\'s', async () => {
    const dir = await tempDir();
    try {
      const path = dir.file('run.extxyz.gz');
      await writeFile(path, gzip(text));
      const opened = await openTrajectory(path, 'run.extxyz.gz');
      same(await assembled(text, 'run.extxyz', false), await assembleTrajectory(opened.frames, { ...UNITS, timeStepPs: 0.5 }, undefined, 'run.extxyz'));
    } finally {
      await dir.remove();
    }
  });
});

describe('assembly sized from the input', () => {
  const system = makeSystem(5, 40, 3, { cellChanges: true });

  it('when the input size is given, then the trajectory equals the one assembled by doubling, for extended and plain XYZ', async () => {
    for (const [text, name] of [[bytes(extxyzText(system)), 'run.extxyz'], [bytes(xyzText(system)), 'run.xyz']] as const) {
      const plain = await assembled(text, name, false);
      same(plain, await assembled(text, name, true, { inputBytes: text.length }));
    }
  });

  it('when the input size is wrong either way, then only the room differs, never the frames', async () => {
    const text = bytes(extxyzText(system));
    const plain = await assembled(text, 'run.extxyz', false);
    for (const inputBytes of [1, text.length / 4, text.length * 3]) same(plain, await assembled(text, 'run.extxyz', true, { inputBytes }));
  });

  it('when later frames are longer than the first two, then frames past the estimate still fit', async () => {
    // Comment lines that grow frame by frame: the first two frames' distance underestimates the rest.
    const text = extxyzText(system).replace(/energy=-1\.5/g, (() => {
      let k = 0;
      return () => `energy=-1.5 note="${'x'.repeat(40 * k++)}"`;
    })());
    const plain = await assembled(bytes(text), 'run.extxyz', false);
    same(plain, await assembled(bytes(text), 'run.extxyz', true, { inputBytes: text.length }));
  });
});

describe('comment lines remembered between frames', () => {
  it('when Properties= changes the column order mid-file, then each frame is read by its own columns', async () => {
    const system = makeSystem(4, 6, 5);
    const head = extxyzText({ ...system, positions: system.positions.slice(0, 3), velocities: system.velocities.slice(0, 3) });
    const tail = extxyzText({ ...system, positions: system.positions.slice(3), velocities: system.velocities.slice(3), times: system.times.slice(3), cells: system.cells.slice(3) }, ['velo', 'species', 'pos']);
    const frames = await readAll(bytes(head + tail), 'run.extxyz');
    frames.forEach((frame, f) => {
      expect(Array.from(frame.positions)).toEqual(Array.from(system.positions[f]!));
      expect(Array.from(frame.velocities!)).toEqual(Array.from(system.velocities[f]!));
    });
  });

  it('when Lattice= changes and then returns, then every frame has its own cell, not a shared one', async () => {
    const system = makeSystem(3, 5, 2, { cellChanges: true });
    system.cells[3] = system.cells[1]!.slice();
    system.cells[4] = system.cells[1]!.slice();
    const frames = await readAll(bytes(extxyzText(system)), 'run.extxyz');
    frames.forEach((frame, f) => expect(Array.from(frame.cell!)).toEqual(Array.from(system.cells[f]!)));
    expect(frames[3]!.cell).not.toBe(frames[4]!.cell);
  });
});
