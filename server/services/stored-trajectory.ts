/**
 * The frames of a stored trajectory, wherever they live: the binary frame
 * store written at inspection (every trajectory inspected by this version),
 * or, for older uploads, the text file itself read again.
 */
import type { Readable } from 'node:stream';
import type { AppContext } from '../context.ts';
import type { TrajectoryRow } from '../db/schema/index.ts';
import type { Compression, Frame, FrameOffset, TrajectoryFormat } from '../formats/frame.ts';
import { readFrames, type FrameRange, type SeekableSource } from '../formats/read-frames.ts';
import { openFrameStore, type FrameStore } from '../frame-store/reader.ts';
import { ChunkCache } from '../frame-store/chunk-cache.ts';
import { readerLimits } from './reader-limits.ts';
import { localCopies } from './local-copies.ts';
import { decodedBytes } from '../formats/decoded.ts';
import { resolveLimits } from '../formats/limits.ts';
import { spoolTo } from '../formats/spool.ts';
import type { LocalCopy } from '../storage/local-copy-cache.ts';

/** A stored trajectory object as a source the readers can open at any byte offset. */
export function storedSource(ctx: AppContext, row: TrajectoryRow): SeekableSource {
  return {
    name: row.name,
    size: row.sizeBytes,
    openAt: (offset: number): Promise<Readable> => ctx.store.getStream(row.objectKey, offset > 0 ? { start: offset } : undefined),
  };
}

export interface StoredFrameIndex {
  format: TrajectoryFormat;
  compression: Compression;
  offsets: FrameOffset[];
}

export async function loadFrameIndex(ctx: AppContext, row: TrajectoryRow): Promise<StoredFrameIndex | null> {
  if (!row.frameIndexKey) return null;
  const bytes = await ctx.store.getBytes(row.frameIndexKey);
  return JSON.parse(Buffer.from(bytes).toString('utf8')) as StoredFrameIndex;
}

/** Opened stores by index key; a key names one trajectory's folder for good, so an entry never goes stale. */
const openedStores = new Map<string, Promise<FrameStore>>();
const MAX_OPEN_STORES = 64;

/** The trajectory's binary frame store, or null for an upload inspected before it existed. */
export function frameStoreOf(ctx: AppContext, row: TrajectoryRow): Promise<FrameStore> | null {
  const key = row.frameStoreKey;
  if (!key) return null;
  let opened = openedStores.get(key);
  if (!opened) {
    opened = openFrameStore(ctx.store, key);
    opened.catch(() => openedStores.delete(key));
    if (openedStores.size >= MAX_OPEN_STORES) openedStores.delete(openedStores.keys().next().value!);
    openedStores.set(key, opened);
  }
  return opened;
}

/** One cache of whole frame-store objects per object store, for the frame viewer only (analyses stream chunks once). */
const viewerCaches = new WeakMap<AppContext['store'], ChunkCache>();
const viewerStores = new Map<string, Promise<FrameStore>>();

/** The frame viewer's cache (FRAME_CACHE_BYTES) of frame-store objects and the answers made from them. */
export function viewerCacheOf(ctx: AppContext): ChunkCache {
  let cache = viewerCaches.get(ctx.store);
  if (!cache) {
    cache = new ChunkCache(ctx.store, ctx.config.FRAME_CACHE_BYTES);
    viewerCaches.set(ctx.store, cache);
  }
  return cache;
}

/**
 * The trajectory's frame store read through the viewer's cache of whole
 * chunks, or null for an upload inspected before the store existed.
 */
export function viewerFrameStoreOf(ctx: AppContext, row: TrajectoryRow): Promise<FrameStore> | null {
  const key = row.frameStoreKey;
  if (!key) return null;
  const cache = viewerCacheOf(ctx);
  let opened = viewerStores.get(key);
  if (!opened) {
    opened = openFrameStore(cache.asSource(), key);
    opened.catch(() => viewerStores.delete(key));
    if (viewerStores.size >= MAX_OPEN_STORES) viewerStores.delete(viewerStores.keys().next().value!);
    viewerStores.set(key, opened);
  }
  return opened;
}

/**
 * Frames of a range in file order, in the file's units. From the frame
 * store no text is parsed, and positions and velocities are views into
 * their chunk (keeping a frame keeps its chunk's memory). An older H5MD
 * upload is read from this process's local copy, by blocks of frames.
 */
export async function* storedFrames(ctx: AppContext, row: TrajectoryRow, range: FrameRange = {}, tempDir?: string): AsyncGenerator<Frame> {
  const store = frameStoreOf(ctx, row);
  if (store) {
    yield* (await store).frames(range);
    return;
  }
  const limits = { ...readerLimits(ctx.config, tempDir), name: row.name };
  if (row.format === 'h5md') {
    const copy = await localH5mdCopy(ctx, row);
    try {
      yield* readFrames(copy.path, range, undefined, limits);
    } finally {
      await copy.release();
    }
    return;
  }
  const index = await loadFrameIndex(ctx, row);
  yield* readFrames(storedSource(ctx, row), range, index?.offsets, {
    ...limits, totalBytes: row.sizeBytes, format: index?.format, compression: index?.compression,
  });
}

/**
 * The H5MD file of an upload on local disk (HDF5 needs random access),
 * decompressed: downloaded once per process and kept for later requests
 * and jobs, each copy held to JOB_TEMP_MAX_BYTES.
 */
export function localH5mdCopy(ctx: AppContext, row: TrajectoryRow): Promise<LocalCopy> {
  return localCopies(ctx.config).acquire(row.objectKey, async (path) => {
    const limits = resolveLimits(readerLimits(ctx.config));
    const decoded = await decodedBytes(await ctx.store.getStream(row.objectKey), row.name, limits);
    await spoolTo(path, decoded.bytes, limits, decoded.file());
  });
}
