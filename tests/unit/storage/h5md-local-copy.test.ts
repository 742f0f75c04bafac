/**
 * An H5MD upload read after inspection without a frame store (uploads
 * inspected before the store existed) is downloaded and decompressed once
 * per process into its local copy; later reads, and reads that start at
 * the same moment, use that copy instead of the object store.
 */
import { mkdtemp, readdir, readFile, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Readable } from 'node:stream';
import { gzipSync } from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadConfig } from '../../../server/config.ts';
import type { AppContext } from '../../../server/context.ts';
import type { TrajectoryRow } from '../../../server/db/schema/index.ts';
import type { Frame } from '../../../server/formats/frame.ts';
import { localCopies } from '../../../server/services/local-copies.ts';
import { storedFrames } from '../../../server/services/stored-trajectory.ts';
import { makeSystem, readAll, writeH5md } from '../formats/synthetic.ts';
import { pollUntil } from '../../support/poll.ts';

let root: string;
let gz: Buffer;
let whole: Frame[];

beforeAll(async () => {
  root = await mkdtemp(join(tmpdir(), 'ergodic-h5md-copy-test-'));
  const path = join(root, 'run.h5');
  await writeH5md(path, makeSystem(6, 15, 3));
  gz = gzipSync(await readFile(path));
  whole = await readAll(path, 'run.h5');
});
afterAll(async () => {
  await rm(root, { recursive: true, force: true });
});

/** An object store holding one gzip H5MD that counts downloads; `gate`, when given, holds each download back until it resolves. */
function countingContext(folder: string, gate?: Promise<void>) {
  const counter = { downloads: 0 };
  const ctx = {
    config: loadConfig({ JOB_TEMP_DIR: join(root, folder), H5MD_COPY_CACHE_BYTES: String(64 * 1024 ** 2) }),
    store: {
      getStream: async () => {
        counter.downloads++;
        return Readable.from((async function* () {
          await gate;
          yield gz;
        })());
      },
    },
  } as unknown as AppContext;
  return { ctx, counter };
}

const row = (key: string) => ({
  id: 1, name: 'run.h5.gz', objectKey: key, sizeBytes: 0, format: 'h5md', compression: 'gzip',
  frameStoreKey: null, frameIndexKey: null, status: 'ready',
}) as unknown as TrajectoryRow;

async function collect(frames: AsyncIterable<Frame>): Promise<number[][]> {
  const out: number[][] = [];
  for await (const frame of frames) out.push(Array.from(frame.positions));
  return out;
}
const expected = (from: number, to: number) => whole.slice(from, to).map((f) => Array.from(f.positions));

describe('local copies of H5MD uploads without a frame store', () => {
  it('when the same upload is read twice in one process, then the second read downloads nothing', async () => {
    const { ctx, counter } = countingContext('twice');
    expect(await collect(storedFrames(ctx, row('p/1/run.h5.gz'), { from: 2, to: 6 }))).toEqual(expected(2, 6));
    expect(await collect(storedFrames(ctx, row('p/1/run.h5.gz'), { from: 9, to: 15 }))).toEqual(expected(9, 15));
    expect(counter.downloads).toBe(1);
  });

  it('when two reads of the same upload start together, then they share one download', async () => {
    let open!: () => void;
    const gate = new Promise<void>((resolve) => (open = resolve));
    const { ctx, counter } = countingContext('together', gate);
    const cache = localCopies(ctx.config);
    const a = collect(storedFrames(ctx, row('p/2/run.h5.gz'), { from: 0, to: 5 }));
    const b = collect(storedFrames(ctx, row('p/2/run.h5.gz'), { from: 10, to: 15 }));
    expect(await pollUntil(async () => cache.stats.joins, (n) => n === 1, 10_000)).toBe(1);
    open();
    expect(await Promise.all([a, b])).toEqual([expected(0, 5), expected(10, 15)]);
    expect(counter.downloads).toBe(1);
  });

  it('when a read is done, then the copy is kept decompressed in the process folder and nothing else is left', async () => {
    const { ctx } = countingContext('kept');
    await collect(storedFrames(ctx, row('p/3/run.h5.gz'), { from: 0, to: 1 }));
    const cache = localCopies(ctx.config);
    expect(cache.dir).toBe(join(root, 'kept', `ergodic-copies-${process.pid}`));
    expect(await cache.has('p/3/run.h5.gz')).toBe(true);
    expect(await cache.sizeBytes()).toBeGreaterThan(gz.length);
    expect(await readdir(join(cache.dir, 'leases'))).toEqual([]);
  });
});
