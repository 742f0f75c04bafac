/**
 * The binary frame store: what inspection writes once beside an upload so
 * that analyses and the frame viewer never parse the text again.
 *
 * Frames are cut into chunk objects of about `DEFAULT_CHUNK_BYTES`. Each
 * chunk holds, for its frames and in the file's own units, little-endian:
 *
 *   positions   Float32  frames × atoms × 3
 *   velocities  Float32  frames × atoms × 3      (when the chunk has them)
 *   times       Float64  frames                  (NaN where a frame states none)
 *   cells       Float64  frames × 9              (lattice vectors as rows; NaN where none)
 *   values      Float64  frames × valueKeys      (other per-frame numbers; NaN where absent)
 *
 * Every section starts at an offset computed from the index, so any frame
 * range of any section is one ranged read. The index (`index.json`) lists the
 * chunks and what is known for the whole trajectory.
 */
import { z } from 'zod';

export const FRAME_STORE_FORMAT = 'ergodic-frames';
export const FRAME_STORE_VERSION = 1;
/** Positions and velocities per chunk object: large enough for few requests, small enough to hold a few in memory. */
export const DEFAULT_CHUNK_BYTES = 8 * 1024 * 1024;
export const INDEX_NAME = 'index.json';

const count = z.number().int().nonnegative();

export const frameChunkSchema = z.object({
  key: z.string().min(1),
  firstFrame: count,
  frames: z.number().int().positive(),
  velocities: z.boolean(),
  times: z.boolean(),
  cells: z.boolean(),
  valueKeys: z.array(z.string()),
  bytes: count,
});
export type FrameChunk = z.infer<typeof frameChunkSchema>;

export const frameStoreIndexSchema = z.object({
  format: z.literal(FRAME_STORE_FORMAT),
  version: z.literal(FRAME_STORE_VERSION),
  atoms: z.number().int().positive(),
  frames: z.number().int().positive(),
  speciesNames: z.array(z.string()),
  /** Each atom's index into speciesNames. */
  speciesIndex: z.array(count),
  /** Every frame has velocities / a time / a cell. */
  hasVelocities: z.boolean(),
  timed: z.boolean(),
  hasCell: z.boolean(),
  pbc: z.tuple([z.boolean(), z.boolean(), z.boolean()]).nullable(),
  chunks: z.array(frameChunkSchema).min(1),
  /** Bytes of all chunks (the index not included). */
  bytes: count,
});
export type FrameStoreIndex = z.infer<typeof frameStoreIndexSchema>;

export interface Section {
  offset: number;
  /** Bytes per frame. */
  stride: number;
}

export interface ChunkSections {
  positions: Section;
  velocities: Section | null;
  times: Section | null;
  cells: Section | null;
  values: Section | null;
  bytes: number;
}

/** Where each section of a chunk starts and how many bytes one frame takes in it. */
export function chunkSections(atoms: number, chunk: Pick<FrameChunk, 'frames' | 'velocities' | 'times' | 'cells' | 'valueKeys'>): ChunkSections {
  let offset = 0;
  const take = (present: boolean, stride: number): Section | null => {
    if (!present) return null;
    const section = { offset, stride };
    offset += stride * chunk.frames;
    return section;
  };
  const positions = take(true, atoms * 12)!;
  const velocities = take(chunk.velocities, atoms * 12);
  const times = take(chunk.times, 8);
  const cells = take(chunk.cells, 72);
  const values = take(chunk.valueKeys.length > 0, 8 * chunk.valueKeys.length);
  return { positions, velocities, times, cells, values, bytes: offset };
}

/** Frames per chunk for a given atom count, so positions and velocities fill about `chunkBytes`. */
export function framesPerChunk(atoms: number, withVelocities: boolean, chunkBytes = DEFAULT_CHUNK_BYTES): number {
  return Math.max(1, Math.floor(chunkBytes / (atoms * 12 * (withVelocities ? 2 : 1))));
}

export function chunkName(index: number): string {
  return `chunk-${String(index).padStart(6, '0')}.bin`;
}
