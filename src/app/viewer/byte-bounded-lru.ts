/**
 * A least-recently-used map bounded by the bytes its values occupy rather
 * than by their number, since one frame of a large system outweighs
 * thousands of frames of a small one.
 */
export class ByteBoundedLru<K, V> {
  // A Map iterates in insertion order, so re-inserting on use keeps the oldest first.
  private readonly entries = new Map<K, { value: V; bytes: number }>();
  private total = 0;

  constructor(
    readonly budgetBytes: number,
    private readonly sizeOf: (value: V) => number,
  ) {
    if (!(budgetBytes > 0)) throw new RangeError('The cache budget must be a positive number of bytes.');
  }

  get bytes(): number {
    return this.total;
  }

  get size(): number {
    return this.entries.size;
  }

  has(key: K): boolean {
    return this.entries.has(key);
  }

  /** The value, marked as most recently used. */
  get(key: K): V | undefined {
    const entry = this.entries.get(key);
    if (!entry) return undefined;
    this.entries.delete(key);
    this.entries.set(key, entry);
    return entry.value;
  }

  /** The value without changing its place in the eviction order. */
  peek(key: K): V | undefined {
    return this.entries.get(key)?.value;
  }

  /**
   * Stores a value and evicts the least recently used ones until the total
   * fits the budget again. A single value larger than the whole budget is
   * still kept (alone), because the viewer cannot show a frame it has dropped.
   */
  set(key: K, value: V): void {
    this.delete(key);
    const bytes = this.sizeOf(value);
    this.entries.set(key, { value, bytes });
    this.total += bytes;
    for (const [oldKey, entry] of this.entries) {
      if (this.total <= this.budgetBytes || oldKey === key) break;
      this.entries.delete(oldKey);
      this.total -= entry.bytes;
    }
  }

  delete(key: K): boolean {
    const entry = this.entries.get(key);
    if (!entry) return false;
    this.entries.delete(key);
    this.total -= entry.bytes;
    return true;
  }

  clear(): void {
    this.entries.clear();
    this.total = 0;
  }
}
