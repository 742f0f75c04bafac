/**
 * Whole frame-store objects kept in memory for the frame viewer, least
 * recently used first out, within a byte budget. Many people scrubbing
 * through one trajectory then cost one object-store read per chunk instead
 * of a few ranged reads per request. Objects under a frame-store key never
 * change (a key names one trajectory's folder for good), so an entry is
 * never stale; one removed with its trajectory simply ages out. Bytes made
 * from such objects (the frames API's encoded answers) are kept in the same
 * budget, under keys of their own, so one setting bounds both.
 */
import type { ObjectSource } from './reader.ts';

export class ChunkCache {
  private readonly entries = new Map<string, Promise<Uint8Array>>();
  private readonly sizes = new Map<string, number>();
  private bytes = 0;

  constructor(private readonly source: ObjectSource, readonly budgetBytes: number) {}

  /** The object, read once and shared by every caller until it is pushed out. */
  get(key: string): Promise<Uint8Array> {
    return this.held(`object:${key}`, () => this.source.getBytes(key));
  }

  /**
   * Bytes made from immutable objects, made once and shared like an object.
   * `key` must name everything the bytes depend on: an entry is never remade.
   */
  made<T extends Uint8Array>(key: string, make: () => Promise<T>): Promise<T> {
    return this.held(`made:${key}`, make) as Promise<T>;
  }

  private held(key: string, load: () => Promise<Uint8Array>): Promise<Uint8Array> {
    const hit = this.entries.get(key);
    if (hit) {
      // Map order is insertion order: re-inserting marks it most recently used.
      this.entries.delete(key);
      this.entries.set(key, hit);
      return hit;
    }
    const loading = load();
    this.entries.set(key, loading);
    loading.then((bytes) => {
      if (this.entries.get(key) !== loading) return;
      this.sizes.set(key, bytes.length);
      this.bytes += bytes.length;
      this.evict(key);
    }, () => {
      if (this.entries.get(key) === loading) this.entries.delete(key);
    });
    return loading;
  }

  /** The source seen through the cache: a range is a view of the cached object. */
  asSource(): ObjectSource {
    return {
      getBytes: (key) => this.get(key),
      getRange: async (key, start, length) => {
        const bytes = await this.get(key);
        if (start + length > bytes.length) throw new Error(`object ${key}: asked for ${length} bytes at ${start}, it has ${bytes.length}`);
        return bytes.subarray(start, start + length);
      },
    };
  }

  get heldBytes(): number {
    return this.bytes;
  }

  /** Drops the least recently used objects until within budget, never the one just read. */
  private evict(keep: string): void {
    for (const key of this.entries.keys()) {
      if (this.bytes <= this.budgetBytes) return;
      if (key === keep) continue;
      const size = this.sizes.get(key);
      if (size === undefined) continue;
      this.entries.delete(key);
      this.sizes.delete(key);
      this.bytes -= size;
    }
  }
}
