/**
 * The one way in: bytes and a name go in; the compression and format are
 * recognised from content, and frames come out. Everything downstream
 * (inspection on upload, frame cuts, assembly for the engine) uses this.
 */
import { stat } from 'node:fs/promises';
import { TrajectoryFormatError, type Compression, type Frame, type TrajectoryFormat } from './frame.ts';
import { resolveLimits, type ReaderLimits } from './limits.ts';
import { ByteCounter, ChunkPool, chunksOf, peek, type ByteSource } from './sources.ts';
import { DETECT_BYTES, detectCompression, detectFormat } from './detect.ts';
import { gunzip, unzipSingle } from './decompress.ts';
import { LineReader } from './line-reader.ts';
import { readXyz } from './xyz.ts';
import { readExtxyz } from './extxyz.ts';
import { readPdb } from './pdb.ts';
import { readH5md } from './h5md.ts';
import { spoolToTempFile } from './spool.ts';
import type { TextReadContext } from './text-frame.ts';

export type { ByteSource } from './sources.ts';

export interface OpenOptions extends ReaderLimits {
  /** Size of the raw input in bytes, when known (a path is stat'ed when this is absent). */
  totalBytes?: number;
  /** Skip detection (e.g. when reading from a byte offset inside a file already inspected). */
  format?: TrajectoryFormat;
  compression?: Compression;
  /** Absolute byte offset the source starts at, and the index of the frame found there. */
  startOffset?: number;
  startIndex?: number;
  /** Frames for which this returns false are stepped over without parsing. */
  wants?: (index: number) => boolean;
  /**
   * Each frame's coordinate arrays are valid only until the next frame is
   * asked for (text formats then refill one pair of arrays): for consumers
   * that copy them at once, such as assembly for the engine.
   */
  transientFrames?: boolean;
}

export interface OpenedTrajectory {
  format: TrajectoryFormat;
  compression: Compression;
  /** Name of the trajectory entry when the upload was a zip archive. */
  entryName?: string;
  /** Frames in file order. Text formats add `byteOffset` (decompressed offset of the frame start). */
  frames: AsyncGenerator<Frame & { byteOffset?: number }>;
  /** Raw (possibly compressed) bytes read so far. */
  rawBytes(): number;
  /** Decompressed bytes read so far. */
  bytes(): number;
}

export async function openTrajectory(source: ByteSource, name: string, options: OpenOptions = {}): Promise<OpenedTrajectory> {
  const limits = resolveLimits(options);
  const startOffset = options.startOffset ?? 0;
  let totalBytes = options.totalBytes;
  if (totalBytes === undefined && typeof source === 'string') totalBytes = (await stat(source)).size;

  const raw = new ByteCounter();
  // A file's read buffers are reused once the line reader is done with them (wired below for uncompressed text only).
  const pool = new ChunkPool();
  const { head, rest } = await peek(raw.count(chunksOf(source, typeof source === 'string' ? startOffset : 0, pool)), DETECT_BYTES);
  if (head.length === 0 && startOffset === 0) {
    await rest.return(undefined);
    throw new TrajectoryFormatError('file is empty', { file: name });
  }
  const compression = options.compression ?? detectCompression(head);
  const entry: { name?: string } = {};
  const decompressed =
    compression === 'gzip' ? gunzip(rest, limits, name) : compression === 'zip' ? unzipSingle(rest, limits, name, entry) : rest;
  const decoded = new ByteCounter();
  const peeked = await peek(decoded.count(decompressed), DETECT_BYTES);
  const file = entry.name ? `${name}/${entry.name}` : name;
  let format: TrajectoryFormat;
  try {
    format = options.format ?? detectFormat(peeked.head, entry.name ?? name);
  } catch (error) {
    await peeked.rest.return(undefined);
    throw error;
  }

  let frames: OpenedTrajectory['frames'];
  if (format === 'h5md') {
    frames = h5mdFrames(source, compression, peeked.rest, file, limits, options);
  } else {
    const ctx: TextReadContext = {
      file,
      limits,
      firstIndex: options.startIndex ?? 0,
      totalBytes: compression === 'none' ? totalBytes : limits.maxDecompressedBytes,
      wants: options.wants,
      transientFrames: options.transientFrames,
    };
    const lines = new LineReader(peeked.rest, {
      file,
      maxLineBytes: limits.maxLineBytes,
      baseOffset: startOffset,
      countLines: startOffset === 0,
      // Only there does the line reader see the file's chunks themselves; a decompressor may keep its input a while.
      recycle: compression === 'none' ? (chunk) => pool.giveBack(chunk) : undefined,
    });
    frames = format === 'pdb' ? readPdb(lines, ctx) : format === 'extxyz' ? readExtxyz(lines, ctx) : readXyz(lines, ctx);
  }
  return {
    format,
    compression,
    entryName: entry.name,
    frames,
    rawBytes: () => raw.bytes,
    bytes: () => decoded.bytes,
  };
}

async function* h5mdFrames(
  source: ByteSource,
  compression: Compression,
  stream: AsyncGenerator<Buffer>,
  file: string,
  limits: ReturnType<typeof resolveLimits>,
  options: OpenOptions,
): AsyncGenerator<Frame> {
  const read = (path: string) => readH5md(path, { file, limits, wants: options.wants, firstIndex: options.startIndex });
  if (typeof source === 'string' && compression === 'none') {
    await stream.return(undefined);
    yield* read(source);
    return;
  }
  const spooled = await spoolToTempFile(stream, limits, file);
  try {
    yield* read(spooled.path);
  } finally {
    await spooled.remove();
  }
}
