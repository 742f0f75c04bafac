import type { Readable } from 'node:stream';
import type { AppContext } from '../context.ts';
import type { TrajectoryRow } from '../db/schema/index.ts';
import type { Compression, FrameOffset, TrajectoryFormat } from '../formats/frame.ts';
import type { SeekableSource } from '../formats/read-frames.ts';

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
