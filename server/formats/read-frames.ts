/**
 * A range of frames (from, to, stride) out of a stored trajectory. For an
 * uncompressed XYZ/extended XYZ file with a frame index, reading starts at
 * the byte offset of the nearest indexed frame (via a byte-range request),
 * so a late frame does not cost a full re-parse; otherwise the file is
 * streamed and unwanted frames are stepped over without parsing numbers.
 */
import type { Compression, Frame, FrameOffset, TrajectoryFormat } from './frame.ts';
import type { ReaderLimits } from './limits.ts';
import { openTrajectory, type ByteSource } from './open-trajectory.ts';
import { nearestOffset } from './frame-index.ts';
import { basename } from 'node:path';

export interface FrameRange {
  /** First frame, 0-based (default 0). */
  from?: number;
  /** One past the last frame (default: to the end). */
  to?: number;
  /** Take every stride-th frame from `from` (default 1). */
  stride?: number;
}

/** A stored file that can be opened at any byte offset (a local path, or an S3 object with Range requests). */
export interface SeekableSource {
  name: string;
  openAt(offset: number): ByteSource | Promise<ByteSource>;
  /** Size of the stored object in bytes, when known. */
  size?: number;
}

export interface ReadFramesOptions extends ReaderLimits {
  /** Name for messages when the source is a stream. */
  name?: string;
  /** Size of the stored file, when known. */
  totalBytes?: number;
  /** What inspection found; both are needed to seek. */
  format?: TrajectoryFormat;
  compression?: Compression;
}

const SEEKABLE_FORMATS = new Set<TrajectoryFormat>(['xyz', 'extxyz']);

export async function* readFrames(
  source: ByteSource | SeekableSource,
  range: FrameRange = {},
  offsets?: readonly FrameOffset[],
  options: ReadFramesOptions = {},
): AsyncGenerator<Frame> {
  const from = range.from ?? 0;
  const to = range.to ?? Infinity;
  const stride = range.stride ?? 1;
  if (!Number.isInteger(from) || from < 0) throw new RangeError(`from must be a non-negative integer, got ${from}`);
  if (!(to === Infinity || Number.isInteger(to)) || to < from) throw new RangeError(`to must be an integer ≥ from, got ${to}`);
  if (!Number.isInteger(stride) || stride < 1) throw new RangeError(`stride must be a positive integer, got ${stride}`);
  if (to === from) return;

  const seekable = typeof source === 'object' && 'openAt' in source ? source : null;
  const name = seekable?.name ?? options.name ?? (typeof source === 'string' ? basename(source) : 'trajectory');
  const wants = (i: number) => i >= from && i < to && (i - from) % stride === 0;

  let start: FrameOffset | undefined;
  const canSeek =
    (seekable || typeof source === 'string') &&
    options.compression === 'none' &&
    options.format !== undefined &&
    SEEKABLE_FORMATS.has(options.format);
  if (canSeek && offsets?.length) start = nearestOffset(offsets, from);
  const offset = start && start.index > 0 ? start : undefined;

  let input: ByteSource;
  if (seekable) input = await seekable.openAt(offset?.offset ?? 0);
  else input = source as ByteSource;

  const opened = await openTrajectory(input, name, {
    ...options,
    totalBytes: seekable?.size ?? options.totalBytes,
    format: offset ? options.format : undefined,
    compression: offset ? 'none' : undefined,
    startOffset: offset?.offset,
    startIndex: offset?.index,
    wants,
  });
  try {
    for await (const frame of opened.frames) {
      if (frame.index >= to) break;
      if (wants(frame.index)) yield frame;
      if (frame.index + stride >= to) break;
    }
  } finally {
    await opened.frames.return(undefined);
  }
}

/** A local file as a seekable source. */
export function seekableFile(path: string, size?: number): SeekableSource {
  return { name: basename(path), openAt: (offset) => (offset ? fileFrom(path, offset) : path), size };
}

async function* fileFrom(path: string, offset: number): AsyncGenerator<Buffer> {
  const { createReadStream } = await import('node:fs');
  yield* createReadStream(path, { start: offset, highWaterMark: 1024 * 1024 }) as AsyncIterable<Buffer>;
}
