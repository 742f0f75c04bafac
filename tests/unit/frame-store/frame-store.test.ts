import { describe, expect, it } from 'vitest';
import type { Frame } from '../../../server/formats/frame.ts';
import { openFrameStore, type StoredFrame } from '../../../server/frame-store/reader.ts';
import { FrameStoreWriter } from '../../../server/frame-store/writer.ts';
import { MemoryStore } from '../../support/memory-store.ts';

const ATOMS = 5;
const SPECIES = ['O', 'H', 'H', 'Na', 'Cl'];

/** Frames whose every number says where it came from, so a misplaced value cannot go unnoticed. */
function frame(f: number, opts: { velocities?: boolean; time?: boolean; cell?: boolean; values?: Record<string, number> } = {}): StoredFrame {
  const positions = new Float64Array(ATOMS * 3).map((_, i) => f * 100 + i + 0.25);
  const out: StoredFrame = { index: f, positions, species: SPECIES, cell: null };
  if (opts.velocities !== false) out.velocities = new Float64Array(ATOMS * 3).map((_, i) => -(f * 100 + i) / 8);
  if (opts.time !== false) out.time = 0.5 * f;
  if (opts.cell !== false) out.cell = Float64Array.from([10 + f, 0, 0, 0.5, 11, 0, 0, 0, 12]);
  if (opts.values) out.values = opts.values;
  return out;
}

async function write(frames: StoredFrame[], chunkBytes = ATOMS * 12 * 2 * 3) {
  const store = new MemoryStore();
  const writer = new FrameStoreWriter(store, 'projects/1/trajectories/u/frames/', { chunkBytes, file: 'run.extxyz' });
  for (const f of frames) await writer.add(f);
  const { index, storedBytes } = await writer.finish();
  return { store, index, storedBytes, indexKey: writer.indexKey };
}

async function readAll(store: MemoryStore, indexKey: string, selection = {}): Promise<StoredFrame[]> {
  const reader = await openFrameStore(store, indexKey);
  const out: StoredFrame[] = [];
  for await (const f of reader.frames(selection)) {
    out.push({ ...f, positions: f.positions.slice(), velocities: f.velocities?.slice(), cell: f.cell?.slice() ?? null });
  }
  return out;
}

describe('the binary frame store', () => {
  it('when frames are written in several chunks and read back, then every position, velocity, time, cell and value returns', async () => {
    const frames = Array.from({ length: 10 }, (_, f) => frame(f, { values: f % 2 ? { energy: -f } : { energy: -f, pressure: f * 2 } }));
    const { store, index, storedBytes, indexKey } = await write(frames);
    expect(index.chunks.length).toBe(4);
    expect(index).toMatchObject({ atoms: ATOMS, frames: 10, hasVelocities: true, timed: true, hasCell: true, speciesNames: ['O', 'H', 'Na', 'Cl'], speciesIndex: [0, 1, 1, 2, 3] });
    expect(storedBytes).toBe([...store.objects.values()].reduce((n, b) => n + b.length, 0));
    const back = await readAll(store, indexKey);
    expect(back.map((f) => f.index)).toEqual(frames.map((f) => f.index));
    back.forEach((f, k) => {
      expect(Array.from(f.positions)).toEqual(Array.from(Float32Array.from(frames[k]!.positions)));
      expect(Array.from(f.velocities!)).toEqual(Array.from(Float32Array.from(frames[k]!.velocities!)));
      expect(f.time).toBe(frames[k]!.time);
      expect(Array.from(f.cell!)).toEqual(Array.from(frames[k]!.cell!));
      expect(f.species).toEqual(SPECIES);
      expect(f.values).toEqual(frames[k]!.values);
    });
  });

  it('when a range with a stride crosses chunks, then exactly those frames come back, in order', async () => {
    const { store, indexKey } = await write(Array.from({ length: 23 }, (_, f) => frame(f)));
    expect((await readAll(store, indexKey, { from: 2, to: 21, stride: 4 })).map((f) => f.index)).toEqual([2, 6, 10, 14, 18]);
    expect((await readAll(store, indexKey, { from: 22 })).map((f) => f.index)).toEqual([22]);
    expect((await readAll(store, indexKey, { from: 5, to: 5 })).map((f) => f.index)).toEqual([]);
  });

  it('when the viewer asks for positions, then only the wanted frames are read, contiguous or sparse, with their times and cells', async () => {
    const frames = Array.from({ length: 40 }, (_, f) => frame(f));
    const { store, indexKey } = await write(frames, ATOMS * 12 * 2 * 8);
    const reader = await openFrameStore(store, indexKey);
    for (const selection of [{ from: 3, to: 12, stride: 1 }, { from: 1, to: 40, stride: 9 }, { from: 39, to: 40, stride: 1 }]) {
      store.gets = 0;
      const { frames: info, positions } = await reader.readPositions(selection);
      const expected = [];
      for (let f = selection.from; f < selection.to; f += selection.stride) expected.push(f);
      expect(info.map((i) => i.index)).toEqual(expected);
      expected.forEach((f, k) => {
        expect(Array.from(positions.subarray(k * ATOMS * 3, (k + 1) * ATOMS * 3))).toEqual(Array.from(Float32Array.from(frames[f]!.positions)));
        expect(info[k]!.time).toBe(0.5 * f);
        expect(info[k]!.cell?.[0]).toBe(10 + f);
      });
      expect(store.gets).toBe(0);
    }
  });

  it('when frames carry no velocities, times or cells, then none are invented', async () => {
    const { store, index, indexKey } = await write(Array.from({ length: 4 }, (_, f) => frame(f, { velocities: false, time: false, cell: false })));
    expect(index).toMatchObject({ hasVelocities: false, timed: false, hasCell: false });
    for (const f of await readAll(store, indexKey)) {
      expect(f.velocities).toBeUndefined();
      expect(f.time).toBeUndefined();
      expect(f.cell).toBeNull();
    }
  });

  it('when a coordinate does not fit a 32-bit float, then the store refuses it naming the file, frame and atom', async () => {
    const bad = frame(2);
    bad.positions[7] = 1e39;
    await expect(write([frame(0), frame(1), bad])).rejects.toThrow(/run\.extxyz, frame 3: atom 3: a coordinate is beyond what 32-bit floats hold/);
  });

  it('when a frame has a different number of atoms, then the store refuses it', async () => {
    const short: Frame = { index: 1, positions: new Float64Array(3), species: ['O'], cell: null };
    await expect(write([frame(0), short])).rejects.toThrow(/frame 2: frame has 1 atoms but the first frame has 5/);
  });

  it('when a write is abandoned, then nothing it stored remains', async () => {
    const store = new MemoryStore();
    store.objects.set('projects/1/trajectories/u/run.xyz', new Uint8Array(3));
    const writer = new FrameStoreWriter(store, 'projects/1/trajectories/u/frames/', { chunkBytes: 200 });
    for (let f = 0; f < 6; f++) await writer.add(frame(f));
    await writer.abort();
    expect(store.keys()).toEqual(['projects/1/trajectories/u/run.xyz']);
  });
});
