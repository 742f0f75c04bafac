/**
 * One streaming pass over an upload that validates every frame and records
 * what the workspace shows before any analysis: sizes, species, cell, time
 * step and a frame index for later random access. Frames are dropped as
 * soon as they are checked, so memory does not grow with the file.
 */
import { createHash } from 'node:crypto';
import { assertFiniteFrame } from './finite-values.ts';
import { handBackArrays, TrajectoryFormatError, type Compression, type Frame, type FrameOffset, type TrajectoryFormat } from './frame.ts';
import { openTrajectory, type ByteSource } from './open-trajectory.ts';
import type { ReaderLimits } from './limits.ts';
import { FrameIndex, DEFAULT_MAX_FRAME_OFFSETS } from './frame-index.ts';

export interface InspectLimits extends ReaderLimits {
  /** Raw size when the caller knows it (a path is stat'ed otherwise). */
  totalBytes?: number;
  /** Most entries kept in frameOffsets (the index thins itself beyond this). */
  maxFrameOffsets?: number;
  /** Compute the SHA-256 of the raw bytes while reading (off when the caller already did). */
  sha256?: boolean;
}

export interface InspectProgress {
  /** Raw bytes read. */
  rawBytes: number;
  /** Decompressed bytes read. */
  bytes: number;
  frames: number;
}

export interface InspectResult {
  format: TrajectoryFormat;
  compression: Compression;
  /** Name of the trajectory inside a zip archive. */
  entryName?: string;
  atoms: number;
  frames: number;
  speciesCounts: Record<string, number>;
  /** Cell of the first frame (9 numbers, lattice vectors as rows) or null. */
  cell: number[] | null;
  cellChanges: boolean;
  pbc?: [boolean, boolean, boolean];
  hasVelocities: boolean;
  /** Mean interval between frame times, in the file's time unit, when frames carry times. */
  timeStep?: number;
  /** True when frame times are not evenly spaced (relative spread above 1e-6). */
  timeUneven?: boolean;
  firstTime?: number;
  sha256?: string;
  /** Decompressed size in bytes (text formats) or raw size. */
  bytes: number;
  /** Decompressed byte offset of frame starts (every frame, or every k-th for long files); empty for H5MD. */
  frameOffsets: FrameOffset[];
  /** Names of per-frame numbers the file carries (energy, pressure… as the file calls them), lower case. */
  fileValues: string[];
}

const PROGRESS_EVERY_BYTES = 8 * 1024 * 1024;
const UNEVEN_TOLERANCE = 1e-6;

export async function inspectTrajectory(
  source: ByteSource,
  name: string,
  limits: InspectLimits = {},
  onProgress?: (progress: InspectProgress) => void,
  /**
   * Sees every frame as it passes (the binary frame store is written from here); a returned promise is awaited.
   * The frame's coordinate arrays are refilled for a later frame after that: copy what is kept.
   */
  onFrame?: (frame: Frame) => Promise<void> | void,
): Promise<InspectResult> {
  const hash = limits.sha256 ? createHash('sha256') : null;
  const input = hash && typeof source !== 'string' ? hashing(source, hash) : source;
  const opened = await openTrajectory(input, name, limits);
  const index = new FrameIndex(limits.maxFrameOffsets ?? DEFAULT_MAX_FRAME_OFFSETS);
  const speciesCounts: Record<string, number> = {};
  let species: string[] | null = null;
  let atoms = 0;
  let frames = 0;
  let firstCell: Float64Array | null = null;
  let cellChanges = false;
  let pbc: [boolean, boolean, boolean] | undefined;
  let hasVelocities = true;
  let firstTime: number | undefined;
  let lastTime: number | undefined;
  let timed = true;
  let minStep = Infinity;
  let maxStep = -Infinity;
  let reported = 0;
  const valueKeys = new Set<string>();
  const file = opened.entryName ? `${name}/${opened.entryName}` : name;

  let frameStartLine = 1;
  for await (const frame of opened.frames) {
    assertFiniteFrame(frame, { file, format: opened.format, frameStartLine });
    frameStartLine += frame.species.length + 2;
    if (frame.byteOffset !== undefined) index.add(frame.index, frame.byteOffset);
    if (species === null) {
      species = frame.species;
      atoms = species.length;
      for (const s of species) speciesCounts[s] = (speciesCounts[s] ?? 0) + 1;
      firstCell = frame.cell;
      pbc = frame.pbc;
    } else {
      if (frame.species !== species) checkSameSpecies(species, frame.species, file, frame.index);
      if (!sameCell(firstCell, frame.cell)) cellChanges = true;
    }
    if (!frame.velocities) hasVelocities = false;
    if (frame.values && valueKeys.size < 64) for (const key in frame.values) valueKeys.add(key);
    if (frame.time === undefined) {
      timed = false;
    } else if (timed) {
      if (lastTime !== undefined) {
        const step = frame.time - lastTime;
        if (step < minStep) minStep = step;
        if (step > maxStep) maxStep = step;
      } else {
        firstTime = frame.time;
      }
      lastTime = frame.time;
    }
    if (onFrame) {
      const pending = onFrame(frame);
      if (pending) await pending;
    }
    // Checked and seen: the reader may refill the frame's arrays for the next one.
    handBackArrays(frame);
    frames++;
    if (onProgress && opened.rawBytes() - reported >= PROGRESS_EVERY_BYTES) {
      reported = opened.rawBytes();
      onProgress({ rawBytes: reported, bytes: opened.bytes(), frames });
    }
  }
  if (frames === 0) throw new TrajectoryFormatError('no frames found', { file });
  onProgress?.({ rawBytes: opened.rawBytes(), bytes: opened.bytes(), frames });

  const result: InspectResult = {
    format: opened.format,
    compression: opened.compression,
    atoms,
    frames,
    speciesCounts,
    cell: firstCell ? Array.from(firstCell) : null,
    cellChanges,
    hasVelocities,
    bytes: opened.format === 'h5md' ? opened.rawBytes() : opened.bytes(),
    frameOffsets: index.toArray(),
    fileValues: [...valueKeys].sort(),
  };
  if (opened.entryName) result.entryName = opened.entryName;
  if (pbc) result.pbc = pbc;
  if (timed && firstTime !== undefined) {
    result.firstTime = firstTime;
    if (frames > 1) {
      const mean = (lastTime! - firstTime) / (frames - 1);
      result.timeStep = mean;
      result.timeUneven = maxStep - minStep > UNEVEN_TOLERANCE * Math.abs(mean);
    }
  }
  if (hash) {
    if (typeof source === 'string') {
      for await (const chunk of (await import('node:fs')).createReadStream(source)) hash.update(chunk as Buffer);
    }
    result.sha256 = hash.digest('hex');
  }
  return result;
}

async function* hashing(source: AsyncIterable<Uint8Array | string>, hash: ReturnType<typeof createHash>): AsyncGenerator<Uint8Array | string> {
  for await (const chunk of source) {
    hash.update(chunk);
    yield chunk;
  }
}

function checkSameSpecies(first: string[], current: string[], file: string, frame: number): void {
  const atom = first.findIndex((s, k) => s !== current[k]);
  if (atom >= 0) {
    throw new TrajectoryFormatError(
      `species of atom ${atom + 1} changes from ${first[atom]} to ${current[atom]}; atoms must keep their species and order`,
      { file, frame },
    );
  }
}

function sameCell(a: Float64Array | null, b: Float64Array | null): boolean {
  if (a === b) return true;
  if (!a || !b) return false;
  for (let k = 0; k < 9; k++) if (a[k] !== b[k]) return false;
  return true;
}
