/**
 * What the text readers share: how a caller steers them (which frames to
 * parse, where the input starts) and the frame they yield, which also
 * carries its byte offset so an index can be built while reading.
 */
import type { Frame } from './frame.ts';
import type { ResolvedLimits } from './limits.ts';

export interface TextReadContext {
  /** Name used in error messages. */
  file: string;
  limits: ResolvedLimits;
  /** Index of the first frame in this input (non-zero after a seek). */
  firstIndex: number;
  /** Total bytes of the (decompressed) input when known, to refuse impossible headers early. */
  totalBytes?: number;
  /** Frames for which this returns false are stepped over without parsing coordinates. */
  wants?: (index: number) => boolean;
  /**
   * The consumer copies each frame's coordinates before asking for the next
   * (as assembly does), so one pair of arrays can be refilled frame after
   * frame instead of a new pair per frame.
   */
  transientFrames?: boolean;
}

export interface TextFrame extends Frame {
  /** Byte offset where this frame starts in the (decompressed) input. */
  byteOffset: number;
}
