import { describe, expect, it } from 'vitest';
import { ByteBoundedLru } from './byte-bounded-lru';

const lruOfArrays = (budget: number) => new ByteBoundedLru<number, Float32Array>(budget, (v) => v.byteLength);

describe('ByteBoundedLru', () => {
  it('when the budget is exceeded, then the least recently used values go first', () => {
    const cache = lruOfArrays(40);
    cache.set(1, new Float32Array(4));
    cache.set(2, new Float32Array(4));
    cache.get(1);
    cache.set(3, new Float32Array(4));

    expect(cache.has(1)).toBe(true);
    expect(cache.has(2)).toBe(false);
    expect(cache.has(3)).toBe(true);
    expect(cache.bytes).toBe(32);
  });

  it('when peeking, then the eviction order does not change', () => {
    const cache = lruOfArrays(32);
    cache.set(1, new Float32Array(4));
    cache.set(2, new Float32Array(4));
    cache.peek(1);
    cache.set(3, new Float32Array(4));
    expect([cache.has(1), cache.has(2), cache.has(3)]).toEqual([false, true, true]);
  });

  it('when a key is stored again, then its old size is released', () => {
    const cache = lruOfArrays(100);
    cache.set(1, new Float32Array(10));
    cache.set(1, new Float32Array(2));
    expect(cache.bytes).toBe(8);
    expect(cache.size).toBe(1);
  });

  it('when one value is larger than the whole budget, then it is kept alone', () => {
    const cache = lruOfArrays(16);
    cache.set(1, new Float32Array(2));
    cache.set(2, new Float32Array(10));
    expect(cache.has(1)).toBe(false);
    expect(cache.get(2)?.length).toBe(10);
    expect(cache.bytes).toBe(40);
  });

  it('when many values stream through, then the total never stays above the budget', () => {
    const cache = lruOfArrays(1000);
    for (let k = 0; k < 500; k++) {
      cache.set(k, new Float32Array(1 + (k % 37)));
      expect(cache.bytes).toBeLessThanOrEqual(1000);
    }
    expect(cache.has(499)).toBe(true);
  });

  it('when deleted or cleared, then the byte count follows', () => {
    const cache = lruOfArrays(100);
    cache.set(1, new Float32Array(3));
    cache.set(2, new Float32Array(5));
    expect(cache.delete(1)).toBe(true);
    expect(cache.delete(1)).toBe(false);
    expect(cache.bytes).toBe(20);
    cache.clear();
    expect([cache.bytes, cache.size]).toEqual([0, 0]);
    expect(() => lruOfArrays(0)).toThrow(RangeError);
  });
});
