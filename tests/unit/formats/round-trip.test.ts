/**
 * The same trajectory must read the same whichever way it is stored:
 * every format, every wrapper, written by the product and read back, and
 * reached by seeking through the frame index or by streaming.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { writeFile } from 'node:fs/promises';
import type { Frame } from '../../../server/formats/frame.ts';
import { writeExtxyz } from '../../../server/formats/write-extxyz.ts';
import { inspectTrajectory } from '../../../server/formats/inspect.ts';
import { readFrames, seekableFile } from '../../../server/formats/read-frames.ts';
import {
  bytes, chunked, extxyzText, gzip, makeSystem, pdbText, readAll, tempDir, writeH5md, xyzText, zip, type System, type TempDir,
} from './synthetic.ts';

const system = makeSystem(7, 6, 11, { cellChanges: true });

function expectFramesMatch(frames: Frame[], source: System, parts: { cell?: boolean; time?: boolean; velocities?: boolean }): void {
  expect(frames.length).toBe(source.positions.length);
  frames.forEach((frame, f) => {
    expect(frame.index).toBe(f);
    expect(frame.species).toEqual(source.species);
    expect(Array.from(frame.positions)).toEqual(Array.from(source.positions[f]));
    if (parts.velocities) expect(Array.from(frame.velocities!)).toEqual(Array.from(source.velocities[f]));
    else expect(frame.velocities).toBeUndefined();
    if (parts.cell) expect(Array.from(frame.cell!)).toEqual(Array.from(source.cells[f]));
    else expect(frame.cell).toBeNull();
    if (parts.time) expect(frame.time).toBe(source.times[f]);
  });
}

/** Byte offsets depend on the file's layout, not on the trajectory. */
const content = (frames: Frame[]) => frames.map(({ byteOffset: _offset, ...rest }: Frame & { byteOffset?: number }) => rest);

async function collect(chunks: AsyncIterable<Uint8Array>): Promise<Buffer> {
  const parts: Buffer[] = [];
  for await (const chunk of chunks) parts.push(Buffer.from(chunk));
  return Buffer.concat(parts);
}

let dir: TempDir;
beforeAll(async () => {
  dir = await tempDir();
});
afterAll(async () => {
  await dir.remove();
});

describe('one system, every format', () => {
  it('when the system is stored as plain XYZ, then positions and species match exactly', async () => {
    expectFramesMatch(await readAll(bytes(xyzText(system)), 'a.xyz'), system, {});
  });

  it('when stored as extended XYZ, then positions, velocities, changing cells and times match exactly', async () => {
    expectFramesMatch(await readAll(bytes(extxyzText(system)), 'a.extxyz'), system, { cell: true, time: true, velocities: true });
  });

  it('when stored as PDB models with CRYST1, then positions, species and cells match exactly', async () => {
    expectFramesMatch(await readAll(bytes(pdbText(system)), 'a.pdb'), system, { cell: true });
  });

  it('when stored as H5MD with a time-dependent box, then everything matches exactly', async () => {
    const path = dir.file('a.h5');
    await writeH5md(path, system, { timeDependentBox: true });
    const frames = await readAll(path, 'a.h5');
    expectFramesMatch(frames, system, { cell: true, time: true, velocities: true });
    expect(frames.map((f) => f.step)).toEqual([0, 10, 20, 30, 40, 50]);
  });
});

describe('compression wrappers', () => {
  const text = bytes(extxyzText(system));

  it('when the file is gzip-compressed or zipped, then the frames are identical to the plain file', async () => {
    const plain = await readAll(text, 'a.extxyz');
    expect(await readAll(gzip(text), 'a.extxyz.gz')).toEqual(plain);
    expect(await readAll(zip({ 'run/a.extxyz': text, 'run/': new Uint8Array(0) }), 'a.zip')).toEqual(plain);
  });

  it('when the input arrives in chunks of 1, 7, 64 and 4093 bytes, then the frames are identical to one big chunk', async () => {
    const whole = await readAll(text, 'a.extxyz');
    expect(await readAll(chunked(text), 'a.extxyz')).toEqual(whole);
    expect(await readAll(chunked(gzip(text), [3, 5000]), 'a.extxyz.gz')).toEqual(whole);
  });

  it('when H5MD arrives gzip-compressed or zipped, then it is spooled and reads identically to the file', async () => {
    const path = dir.file('b.h5');
    await writeH5md(path, system);
    const { readFile } = await import('node:fs/promises');
    const raw = await readFile(path);
    const direct = await readAll(path, 'b.h5');
    expect(await readAll(chunked(gzip(raw), [65536]), 'b.h5.gz', { tempDir: dir.path })).toEqual(direct);
    expect(await readAll(chunked(zip({ 'b.h5': raw }), [65536]), 'b.zip', { tempDir: dir.path })).toEqual(direct);
    const { readdir } = await import('node:fs/promises');
    expect((await readdir(dir.path)).filter((n) => n.startsWith('ergodic-h5md-'))).toEqual([]);
  });
});

describe('writing extended XYZ', () => {
  it('when frames are written and read back, then every value, cell, time and pbc is identical', async () => {
    const original = await readAll(bytes(extxyzText(system)), 'a.extxyz');
    const written = await collect(writeExtxyz(original));
    // Velocities go under Ergodic's own property name, whatever the input called them.
    expect(written.toString('utf8').split('\n')[1]).toMatch(/Properties=species:S:1:pos:R:3:velocity:R:3(\s|$)/);
    expect(written.toString('utf8')).not.toMatch(/:velo:|:vel:/);
    const back = await readAll(written, 'cut.extxyz');
    expect(content(back)).toEqual(content(original));
  });

  it('when frames hold Float32 values without cell or time, then they still read back to the same numbers', async () => {
    const frames: Frame[] = [0, 1].map((index) => ({
      index,
      positions: Float32Array.from([0.1, -2.5e-7, 3.3333333, 1e5, 7, -0]),
      species: ['Fe', 'o'],
      cell: null,
    }));
    const back = await readAll(await collect(writeExtxyz(frames)), 'f32.extxyz');
    expect(back.map((f) => Array.from(f.positions))).toEqual(frames.map((f) => Array.from(f.positions)));
    expect(back[1].species).toEqual(['Fe', 'o']);
    expect(back[0].cell).toBeNull();
  });
});

describe('random access through the frame index', () => {
  const big = makeSystem(5, 40, 3);
  const text = extxyzText(big);

  it('when frame k is read via its byte offset, then it equals frame k reached by streaming', async () => {
    const path = dir.file('seek.extxyz');
    await writeFile(path, text);
    const info = await inspectTrajectory(path, 'seek.extxyz');
    expect(info.frameOffsets).toHaveLength(40);
    const streamed = await readAll(path, 'seek.extxyz');
    for (const k of [0, 1, 17, 39]) {
      const got: Frame[] = [];
      for await (const frame of readFrames(seekableFile(path), { from: k, to: k + 1 }, info.frameOffsets, info)) got.push(frame);
      expect(got).toHaveLength(1);
      expect(got[0]).toEqual(streamed[k]);
    }
  });

  it('when the index is thinned to every 8th frame, then a range with a stride still equals the streamed frames', async () => {
    const path = dir.file('thin.extxyz');
    await writeFile(path, text);
    const info = await inspectTrajectory(path, 'thin.extxyz', { maxFrameOffsets: 5 });
    expect(info.frameOffsets.map((o) => o.index)).toEqual([0, 8, 16, 24, 32]);
    const streamed = await readAll(path, 'thin.extxyz');
    const got: Frame[] = [];
    for await (const frame of readFrames(seekableFile(path), { from: 21, to: 35, stride: 4 }, info.frameOffsets, info)) got.push(frame);
    expect(got.map((f) => f.index)).toEqual([21, 25, 29, 33]);
    expect(got).toEqual([21, 25, 29, 33].map((k) => streamed[k]));
  });

  it('when the source is compressed, then frames are reached by streaming and match', async () => {
    const gz = gzip(bytes(text));
    const streamed = await readAll(bytes(text), 'x.extxyz');
    const got: Frame[] = [];
    for await (const frame of readFrames(chunked(gz, [1000]), { from: 30, stride: 5 }, undefined, { name: 'x.extxyz.gz' })) got.push(frame);
    expect(got).toEqual([30, 35].map((k) => streamed[k]));
  });

  it('when a byte offset is served by a range request, then only bytes from that offset are read', async () => {
    const path = dir.file('range.extxyz');
    await writeFile(path, text);
    const info = await inspectTrajectory(path, 'range.extxyz');
    const whole = bytes(text);
    const requested: number[] = [];
    const source = {
      name: 'range.extxyz',
      size: whole.length,
      openAt: (offset: number) => {
        requested.push(offset);
        return chunked(whole.subarray(offset), [500]);
      },
    };
    const got: Frame[] = [];
    for await (const frame of readFrames(source, { from: 36, to: 38 }, info.frameOffsets, info)) got.push(frame);
    expect(requested).toEqual([info.frameOffsets[36].offset]);
    expect(got.map((f) => f.index)).toEqual([36, 37]);
    expect(Array.from(got[1].positions)).toEqual(Array.from(big.positions[37]));
  });

  it('when PDB or H5MD frames are requested, then the range and stride are honoured', async () => {
    const pdbPath = dir.file('r.pdb');
    await writeFile(pdbPath, pdbText(big));
    const h5Path = dir.file('r.h5');
    await writeH5md(h5Path, big);
    for (const path of [pdbPath, h5Path]) {
      const got: Frame[] = [];
      for await (const frame of readFrames(path, { from: 3, to: 12, stride: 3 })) got.push(frame);
      expect(got.map((f) => f.index)).toEqual([3, 6, 9]);
      expect(Array.from(got[2].positions)).toEqual(Array.from(big.positions[9]));
    }
  });
});
