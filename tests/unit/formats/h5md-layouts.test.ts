/**
 * H5MD leaves writers several choices: fixed or time-dependent box, edges
 * as lengths or a matrix, step/time as arrays or as a fixed interval,
 * species as codes with or without names. Each must read the same way.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { File as H5File, Group } from 'h5wasm';
import { h5, readAll, tempDir, type TempDir } from './synthetic.ts';
import { inspectTrajectory } from '../../../server/formats/inspect.ts';

let dir: TempDir;
beforeAll(async () => {
  dir = await tempDir();
});
afterAll(async () => {
  await dir.remove();
});

/** Two frames of three atoms; frame f has atom a at (10f + a, a, -a). */
const POSITIONS = Float32Array.from({ length: 18 }, (_, k) => {
  const f = Math.floor(k / 9);
  const a = Math.floor((k % 9) / 3);
  return [10 * f + a, a, -a][k % 3];
});

async function build(name: string, fill: (group: Group, file: H5File) => void): Promise<string> {
  const { File } = await h5();
  const path = dir.file(name);
  const file = new File(path, 'w');
  const group = file.create_group('particles').create_group('atoms');
  const position = group.create_group('position');
  position.create_dataset({ name: 'value', data: POSITIONS, shape: [2, 3, 3] });
  fill(group, file);
  file.close();
  return path;
}

describe('H5MD layouts', () => {
  it('when positions are 32-bit floats in a group not called "all", then they come back as Float32 values unchanged', async () => {
    const frames = await readAll(await build('f32.h5', () => {}), 'f32.h5');
    expect(frames[1].positions).toBeInstanceOf(Float32Array);
    expect(Array.from(frames[1].positions)).toEqual(Array.from(POSITIONS.subarray(9)));
    expect(frames[0].cell).toBeNull();
    expect(frames[0].time).toBeUndefined();
  });

  it('when step and time are scalars with offsets (fixed sampling), then frame i has offset + i·interval', async () => {
    const path = await build('scalar.h5', (group) => {
      const position = group.get('position') as Group;
      const step = position.create_dataset({ name: 'step', data: 50 });
      step.create_attribute('offset', 1000);
      const time = position.create_dataset({ name: 'time', data: 0.1 });
      time.create_attribute('offset', 2);
    });
    const frames = await readAll(path, 'scalar.h5');
    expect(frames.map((f) => [f.step, f.time])).toEqual([[1000, 2], [1050, 2.1]]);
  });

  it('when box edges are a fixed 3×3 matrix, then every frame gets that matrix as lattice rows', async () => {
    const matrix = [10, 0, 0, 2, 9, 0, 1, 1, 8];
    const path = await build('matrix.h5', (group) => {
      const box = group.create_group('box');
      box.create_attribute('dimension', 3);
      box.create_attribute('boundary', ['periodic', 'periodic', 'none']);
      box.create_dataset({ name: 'edges', data: Float64Array.from(matrix), shape: [3, 3] });
    });
    const frames = await readAll(path, 'matrix.h5');
    expect(frames.map((f) => Array.from(f.cell!))).toEqual([matrix, matrix]);
    expect(frames[0].pbc).toEqual([true, true, false]);
  });

  it('when box edges are time-dependent lengths, then each frame gets its own rectangular cell and inspection sees it change', async () => {
    const path = await build('tdbox.h5', (group) => {
      const box = group.create_group('box');
      box.create_attribute('dimension', 3);
      box.create_attribute('boundary', ['periodic', 'periodic', 'periodic']);
      box.create_group('edges').create_dataset({ name: 'value', data: Float64Array.from([10, 11, 12, 10.5, 11.5, 12.5]), shape: [2, 3] });
    });
    const frames = await readAll(path, 'tdbox.h5');
    expect(Array.from(frames[1].cell!)).toEqual([10.5, 0, 0, 0, 11.5, 0, 0, 0, 12.5]);
    const info = await inspectTrajectory(path, 'tdbox.h5');
    expect(info.cellChanges).toBe(true);
    expect(info.frameOffsets).toEqual([]);
  });

  it('when species are integer codes without names, then the codes are the labels', async () => {
    const path = await build('codes.h5', (group) => {
      group.create_dataset({ name: 'species', data: Int32Array.from([8, 1, 1]) });
    });
    const info = await inspectTrajectory(path, 'codes.h5');
    expect(info.speciesCounts).toEqual({ '8': 1, '1': 2 });
  });

  it('when species codes come with names and codes attributes, then the names are used', async () => {
    const path = await build('named.h5', (group) => {
      const species = group.create_dataset({ name: 'species', data: Int32Array.from([8, 1, 1]) });
      species.create_attribute('names', ['O', 'H']);
      species.create_attribute('codes', Int32Array.from([8, 1]));
    });
    const [frame] = await readAll(path, 'named.h5');
    expect(frame.species).toEqual(['O', 'H', 'H']);
  });

  it('when species is time-dependent, then the first frame’s species are used', async () => {
    const path = await build('tdspecies.h5', (group) => {
      const species = group.create_group('species');
      species.create_dataset({ name: 'value', data: Int32Array.from([0, 1, 1, 0, 1, 1]), shape: [2, 3] });
      species.create_attribute('names', ['Si', 'O']);
    });
    const [frame] = await readAll(path, 'tdspecies.h5');
    expect(frame.species).toEqual(['Si', 'O', 'O']);
  });

  it('when H5MD arrives as a stream without a path, then it is spooled and read', async () => {
    const path = await build('stream.h5', () => {});
    const { createReadStream } = await import('node:fs');
    const frames = await readAll(createReadStream(path, { highWaterMark: 1000 }), 'upload.bin', { tempDir: dir.path });
    expect(frames).toHaveLength(2);
    expect(Array.from(frames[0].positions)).toEqual(Array.from(POSITIONS.subarray(0, 9)));
  });
});
