/**
 * A bounded index of frame start offsets. When it fills up, every other
 * entry is dropped and only every 2k-th frame is recorded from then on, so
 * a million-frame file costs a few thousand entries; a reader seeks to the
 * nearest indexed frame at or before the one it wants and steps forward.
 */
import type { FrameOffset } from './frame.ts';

export const DEFAULT_MAX_FRAME_OFFSETS = 16_384;

export class FrameIndex {
  private entries: FrameOffset[] = [];
  private every = 1;

  constructor(private readonly maxEntries = DEFAULT_MAX_FRAME_OFFSETS) {
    if (!(maxEntries >= 2)) throw new RangeError('a frame index needs room for at least 2 entries');
  }

  add(index: number, offset: number): void {
    if (index % this.every !== 0) return;
    this.entries.push({ index, offset });
    if (this.entries.length > this.maxEntries) {
      this.every *= 2;
      this.entries = this.entries.filter((entry) => entry.index % this.every === 0);
    }
  }

  toArray(): FrameOffset[] {
    return this.entries.slice();
  }
}

/** The indexed frame at or before `frame`, or undefined when none is. */
export function nearestOffset(offsets: readonly FrameOffset[], frame: number): FrameOffset | undefined {
  let lo = 0;
  let hi = offsets.length - 1;
  let best: FrameOffset | undefined;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    if (offsets[mid].index <= frame) {
      best = offsets[mid];
      lo = mid + 1;
    } else {
      hi = mid - 1;
    }
  }
  return best;
}
