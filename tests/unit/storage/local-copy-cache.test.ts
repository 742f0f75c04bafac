/**
 * Local copies of stored objects: made once per process and reused, one
 * download shared by readers that ask at the same moment, least recently
 * used copies removed from disk once the folder passes its byte budget,
 * and a copy being read stays readable until its reader lets go.
 */
import { mkdtemp, readdir, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { LocalCopyCache } from '../../../server/storage/local-copy-cache.ts';
import { pollUntil } from '../../support/poll.ts';

let root: string;
beforeEach(async () => {
  root = await mkdtemp(join(tmpdir(), 'ergodic-local-copy-test-'));
});
afterEach(async () => {
  await rm(root, { recursive: true, force: true });
});

/** A fill that writes `bytes` of the key's content and counts how often it ran. */
function countingFill(bytes: number) {
  const calls: string[] = [];
  return {
    calls,
    fill: (key: string) => async (path: string) => {
      calls.push(key);
      await writeFile(path, Buffer.alloc(bytes, key));
    },
  };
}

const copies = async (cache: LocalCopyCache) => (await readdir(cache.dir)).filter((n) => n.endsWith('.copy'));

describe('local copy cache', () => {
  it('when the same key is asked for twice, then the second read finds the copy and downloads nothing', async () => {
    const cache = new LocalCopyCache(join(root, 'copies'), 1024);
    const { calls, fill } = countingFill(100);
    const first = await cache.acquire('projects/1/run.h5', fill('a'));
    await first.release();
    const second = await cache.acquire('projects/1/run.h5', fill('a'));
    expect((await readFile(second.path)).toString()).toBe('a'.repeat(100));
    await second.release();
    expect(calls).toEqual(['a']);
    expect(cache.stats).toEqual({ fills: 1, joins: 0, hits: 1 });
  });

  it('when two readers ask for a key at the same moment, then they share one download', async () => {
    const cache = new LocalCopyCache(join(root, 'copies'), 1024);
    let open!: () => void;
    const gate = new Promise<void>((resolve) => (open = resolve));
    let downloads = 0;
    const fill = async (path: string) => {
      downloads++;
      await gate;
      await writeFile(path, 'shared');
    };
    const a = cache.acquire('k', fill);
    const b = cache.acquire('k', fill);
    expect((await pollUntil(async () => cache.stats.joins, (n) => n === 1, 10_000))).toBe(1);
    open();
    const [ca, cb] = await Promise.all([a, b]);
    expect([(await readFile(ca.path)).toString(), (await readFile(cb.path)).toString()]).toEqual(['shared', 'shared']);
    expect(downloads).toBe(1);
    await Promise.all([ca.release(), cb.release()]);
  });

  it('when copies pass the budget, then the least recently used one is deleted from disk and a later read downloads it again', async () => {
    const cache = new LocalCopyCache(join(root, 'copies'), 250);
    const { calls, fill } = countingFill(100);
    for (const key of ['a', 'b']) await (await cache.acquire(key, fill(key))).release();
    // 'a' is read again, so 'b' is now the least recently used.
    await (await cache.acquire('a', fill('a'))).release();
    await (await cache.acquire('c', fill('c'))).release();
    expect(await cache.has('b')).toBe(false);
    expect([await cache.has('a'), await cache.has('c')]).toEqual([true, true]);
    expect(await copies(cache)).toHaveLength(2);
    expect(await cache.sizeBytes()).toBe(200);
    await (await cache.acquire('b', fill('b'))).release();
    expect(calls).toEqual(['a', 'b', 'c', 'b']);
  });

  it('when a copy larger than the whole budget is read, then it stays readable while held and is deleted once released', async () => {
    const cache = new LocalCopyCache(join(root, 'copies'), 50);
    const { fill } = countingFill(100);
    const held = await cache.acquire('big', fill('big'));
    expect(await cache.has('big')).toBe(true);
    expect((await readFile(held.path)).length).toBe(100);
    await held.release();
    expect(await cache.has('big')).toBe(false);
    expect(await cache.sizeBytes()).toBe(0);
  });

  it('when a held copy is evicted or dropped, then its reader still reads it to the end', async () => {
    const cache = new LocalCopyCache(join(root, 'copies'), 1024);
    const { fill } = countingFill(100);
    const held = await cache.acquire('gone', fill('g'));
    await cache.drop('gone');
    expect(await cache.has('gone')).toBe(false);
    expect((await readFile(held.path)).toString()).toBe('g'.repeat(100));
    await held.release();
    expect(await readdir(join(cache.dir, 'leases'))).toEqual([]);
  });

  it('when a download fails, then nothing is left under the key and the next reader downloads again', async () => {
    const cache = new LocalCopyCache(join(root, 'copies'), 1024);
    const broken = async (path: string) => {
      await writeFile(path, 'half');
      throw new Error('connection reset');
    };
    await expect(cache.acquire('k', broken)).rejects.toThrow('connection reset');
    expect(await readdir(cache.dir)).toEqual(['leases']);
    const { calls, fill } = countingFill(10);
    await (await cache.acquire('k', fill('k'))).release();
    expect(calls).toEqual(['k']);
  });

  it('when the folder is cleared, then every copy is gone from disk', async () => {
    const cache = new LocalCopyCache(join(root, 'copies'), 1024);
    const { fill } = countingFill(10);
    await (await cache.acquire('k', fill('k'))).release();
    await cache.clear();
    expect(await readdir(root)).toEqual([]);
  });

  it('when the budget is not a positive number, then the cache refuses it by name', () => {
    expect(() => new LocalCopyCache(root, 0)).toThrow('local copy budget must be a positive number of bytes, got 0');
  });
});
