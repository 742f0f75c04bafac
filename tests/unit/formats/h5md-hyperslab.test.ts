/**
 * H5MD positions and velocities are read as hyperslabs of whole frames
 * (one block at a time), never as whole datasets, so a range of frames
 * costs memory for a block and not for the file; the numbers must be
 * exactly those of a read of the whole file.
 */
import { afterAll, afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import { h5, makeSystem, readAll, tempDir, writeH5md, type TempDir } from './synthetic.ts';
import { readH5md } from '../../../server/formats/h5md.ts';
import { resolveLimits } from '../../../server/formats/limits.ts';
import { readFrames } from '../../../server/formats/read-frames.ts';
import type { Frame } from '../../../server/formats/frame.ts';

const ATOMS = 7;
const FRAMES = 23;
let dir: TempDir;
let path: string;
let whole: Frame[];

beforeAll(async () => {
  dir = await tempDir();
  path = dir.file('multi.h5');
  await writeH5md(path, makeSystem(ATOMS, FRAMES, 11, { cellChanges: true }), { timeDependentBox: true });
  whole = await readAll(path, 'multi.h5');
});
afterAll(async () => {
  await dir.remove();
});
afterEach(() => {
  vi.restoreAllMocks();
});

/** The numbers of a frame, as plain arrays, so typed-array kinds and views do not matter. */
const numbers = (f: Frame) => ({
  index: f.index, positions: Array.from(f.positions), velocities: Array.from(f.velocities ?? []),
  cell: Array.from(f.cell ?? []), time: f.time, step: f.step, species: f.species,
});

async function collect(frames: AsyncIterable<Frame>): Promise<Frame[]> {
  const out: Frame[] = [];
  for await (const frame of frames) out.push(frame);
  return out;
}

describe('H5MD frame ranges by hyperslab', () => {
  it('when the whole file is read, then it has every frame of the fixture', () => {
    expect(whole.map((f) => f.index)).toEqual(Array.from({ length: FRAMES }, (_, i) => i));
  });

  it.each([[0, 1], [5, 12], [3, 23], [22, 23]])('when frames [%i, %i) are read, then they equal the same frames of the whole-file read', async (a, b) => {
    const range = await collect(readFrames(path, { from: a, to: b }));
    expect(range.map(numbers)).toEqual(whole.slice(a, b).map(numbers));
  });

  it('when a range is read in blocks of 3 frames, then every dataset read is a slice of at most 3 frames and the numbers still match', async () => {
    const { Dataset } = await h5();
    const slice = vi.spyOn(Dataset.prototype, 'slice');
    const wholeValue = vi.spyOn(Dataset.prototype, 'value', 'get');
    const perFrame = ATOMS * 3 * 8;
    const frames = await collect(readH5md(path, {
      file: 'multi.h5', limits: resolveLimits(), blockBytes: 3 * perFrame, wants: (i) => i >= 4 && i < 15,
    }));
    expect(frames.map(numbers)).toEqual(whole.slice(4, 15).map(numbers));
    const frameSlices = slice.mock.calls.filter((_, k) => /\/(position|velocity)\/value$/.test((slice.mock.contexts[k] as { path: string }).path));
    // Positions and velocities of frames 4..14 in blocks of 3: [4,7) [7,10) [10,13) [13,15), for each.
    expect(frameSlices.map(([ranges]) => ranges)).toEqual([
      [[4, 7]], [[4, 7]], [[7, 10]], [[7, 10]], [[10, 13]], [[10, 13]], [[13, 15]], [[13, 15]],
    ]);
    const wholeReads = wholeValue.mock.contexts.map((d) => (d as { path: string }).path);
    expect(wholeReads.filter((p) => /\/(position|velocity)\/value$/.test(p))).toEqual([]);
  });

  it('when every third frame is wanted, then only those frames are read, in one strided slice, and they match the whole-file read', async () => {
    const { Dataset } = await h5();
    const slice = vi.spyOn(Dataset.prototype, 'slice');
    const frames = await collect(readFrames(path, { from: 2, to: 20, stride: 3 }));
    expect(frames.map(numbers)).toEqual([2, 5, 8, 11, 14, 17].map((i) => numbers(whole[i])));
    expect(frameSlices(slice, 'position')).toEqual([[[2, 18, 3]]]);
  });
});

describe('H5MD strided frame selections', () => {
  /** The frames at `indices`, each read on its own as a range of one frame. */
  async function oneByOne(indices: number[]): Promise<Frame[]> {
    const out: Frame[] = [];
    for (const i of indices) out.push(...(await collect(readFrames(path, { from: i, to: i + 1 }))));
    return out;
  }
  const selected = (from: number, to: number, stride: number) =>
    Array.from({ length: Math.ceil((Math.min(to, FRAMES) - from) / stride) }, (_, k) => from + k * stride);

  it.each([[0, 23, 2], [1, 23, 4], [3, 22, 5], [0, 23, 22], [7, 8, 3], [5, 23, 1]])(
    'when frames from %i to %i by %i are read, then they equal the same frames read one at a time, to the last bit',
    async (from, to, stride) => {
      const strided = await collect(readFrames(path, { from, to, stride }));
      const single = await oneByOne(selected(from, to, stride));
      expect(strided.map((f) => f.index)).toEqual(selected(from, to, stride));
      expect(strided.map(numbers)).toEqual(single.map(numbers));
    },
  );

  it('when a strided selection spans several blocks, then each block is one strided slice of positions and one of velocities', async () => {
    const single = await oneByOne([1, 5, 9, 13, 17, 21]);
    const { Dataset } = await h5();
    const slice = vi.spyOn(Dataset.prototype, 'slice');
    const perFrame = ATOMS * 3 * 8;
    // Frames 1, 5, 9, 13, 17, 21 in blocks of 2 frames.
    const frames = await collect(readH5md(path, {
      file: 'multi.h5', limits: resolveLimits(), blockBytes: 2 * perFrame, wants: (i) => i >= 1 && (i - 1) % 4 === 0,
    }));
    expect(frames.map(numbers)).toEqual(single.map(numbers));
    expect(frameSlices(slice, 'position')).toEqual([[[1, 6, 4]], [[9, 14, 4]], [[17, 22, 4]]]);
    expect(frameSlices(slice, 'velocity')).toEqual([[[1, 6, 4]], [[9, 14, 4]], [[17, 22, 4]]]);
  });

  it('when the wanted frames are not evenly spaced, then each even run is one slice and no unwanted frame is returned', async () => {
    const wanted = [0, 2, 4, 5, 6, 10, 13, 16, 17];
    const single = await oneByOne(wanted);
    const { Dataset } = await h5();
    const slice = vi.spyOn(Dataset.prototype, 'slice');
    const frames = await collect(readH5md(path, { file: 'multi.h5', limits: resolveLimits(), wants: (i) => wanted.includes(i) }));
    expect(frames.map(numbers)).toEqual(single.map(numbers));
    expect(frameSlices(slice, 'position')).toEqual([[[0, 5, 2]], [[5, 7]], [[10, 17, 3]], [[17, 18]]]);
  });
});

/** The ranges of every slice of /…/<element>/value since the spy was set. */
function frameSlices(slice: { mock: { calls: unknown[][]; contexts: unknown[] } }, element: 'position' | 'velocity'): unknown[] {
  const pattern = new RegExp(`/${element}/value$`);
  return slice.mock.calls.filter((_, k) => pattern.test((slice.mock.contexts[k] as { path: string }).path)).map(([ranges]) => ranges);
}
