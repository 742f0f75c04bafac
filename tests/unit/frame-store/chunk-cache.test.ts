import { describe, expect, it } from 'vitest';
import { ChunkCache } from '../../../server/frame-store/chunk-cache.ts';
import type { ObjectSource } from '../../../server/frame-store/reader.ts';

/** An object store of fixed objects that counts whole reads. */
function countingSource(objects: Record<string, Uint8Array>): ObjectSource & { reads: string[] } {
  const reads: string[] = [];
  return {
    reads,
    getBytes: async (key) => {
      reads.push(key);
      const bytes = objects[key];
      if (!bytes) throw new Error(`no object ${key}`);
      return bytes;
    },
    getRange: async () => { throw new Error('the cache reads whole objects'); },
  };
}

const filled = (n: number, v: number) => new Uint8Array(n).fill(v);

describe('the frame viewer cache of frame-store objects', () => {
  it('when many requests want ranges of one object at once, then it is read from the store once and each range holds its bytes', async () => {
    const bytes = Uint8Array.from({ length: 100 }, (_, i) => i);
    const source = countingSource({ a: bytes });
    const cached = new ChunkCache(source, 1000).asSource();
    const ranges = await Promise.all(Array.from({ length: 20 }, (_, k) => cached.getRange('a', k, 10)));
    expect(source.reads).toEqual(['a']);
    ranges.forEach((r, k) => expect(Array.from(r)).toEqual(Array.from({ length: 10 }, (_, i) => k + i)));
    await expect(cached.getRange('a', 95, 10)).rejects.toThrow(/asked for 10 bytes at 95, it has 100/);
  });

  it('when objects exceed the budget, then the least recently used go first and are read again when wanted', async () => {
    const source = countingSource({ a: filled(40, 1), b: filled(40, 2), c: filled(40, 3) });
    const cache = new ChunkCache(source, 100);
    await cache.get('a');
    await cache.get('b');
    await cache.get('a'); // a is now the most recently used
    await cache.get('c'); // 120 bytes: b goes
    expect(cache.heldBytes).toBe(80);
    await cache.get('a');
    await cache.get('b');
    expect(source.reads).toEqual(['a', 'b', 'c', 'b']);
  });

  it('when a read fails, then the failure is not kept: the next request tries the store again', async () => {
    const source = countingSource({});
    const cache = new ChunkCache(source, 100);
    await expect(cache.get('missing')).rejects.toThrow(/no object missing/);
    await expect(cache.get('missing')).rejects.toThrow(/no object missing/);
    expect(source.reads).toEqual(['missing', 'missing']);
    expect(cache.heldBytes).toBe(0);
  });

  it('when many requests want the same made bytes at once, then they are made once, share the budget with objects, and a failure is not kept', async () => {
    const source = countingSource({ a: filled(60, 1) });
    const cache = new ChunkCache(source, 100);
    let makings = 0;
    const make = async () => { makings++; return filled(30, 7); };
    const all = await Promise.all(Array.from({ length: 10 }, () => cache.made('payload of a', make)));
    expect(makings).toBe(1);
    all.forEach((bytes) => expect(bytes).toBe(all[0]));
    await cache.get('a');
    expect(cache.heldBytes).toBe(90);
    // A made entry never stands in for the object of the same name, or the other way round.
    expect(await cache.made('a', make)).toHaveLength(30);
    expect(makings).toBe(2);
    expect(cache.heldBytes).toBeLessThanOrEqual(100);
    await expect(cache.made('broken', async () => { throw new Error('could not make it'); })).rejects.toThrow(/could not make it/);
    expect(await cache.made('broken', make)).toHaveLength(30);
  });
});
