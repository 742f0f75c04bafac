/**
 * The one shape every trajectory reader produces, whatever the file format.
 * Readers stream: they yield one frame at a time and never hold a whole file.
 * Values are in the file's own units; conversion to Å and ps happens when a
 * trajectory is assembled for the engine (see server/analysis/trajectory.ts).
 */

/** Lattice vectors a, b, c as rows: [ax, ay, az, bx, by, bz, cx, cy, cz]. */
export type Cell = Float64Array;

export interface Frame {
  /** 0-based index of the frame in the file. */
  index: number;
  /** x, y, z per atom, length 3·N, in the file's length unit. */
  positions: Float32Array | Float64Array;
  /** vx, vy, vz per atom when the file has them, in the file's velocity unit. */
  velocities?: Float32Array | Float64Array;
  /** Element symbol (or label) per atom, length N. */
  species: string[];
  /** Periodic cell of this frame, or null when the file states none. */
  cell: Cell | null;
  /** Which directions are periodic, when the file says (extended XYZ pbc=, H5MD boundary). */
  pbc?: [boolean, boolean, boolean];
  /** Simulation time of this frame in the file's time unit, when stated. */
  time?: number;
  /** Integration step number, when stated. */
  step?: number;
  /**
   * Other per-frame numbers the file states (extended XYZ comment keys such
   * as energy=…, H5MD observables), by lower-case name, in the file's units.
   */
  values?: Record<string, number>;
}

/** Frames whose reader can refill their coordinate arrays → how it takes them back (kept off the frame, which stays plain data). */
const takeBacks = new WeakMap<Frame, () => void>();

/** For readers: `takeBack` lets the reader refill this frame's coordinate arrays for a later frame. */
export function offerArrays(frame: Frame, takeBack: () => void): void {
  takeBacks.set(frame, takeBack);
}

/**
 * For consumers that have copied a frame's coordinates and keep no reference
 * to its arrays: the reader may refill them for a later frame, so reading does
 * not leave a pair of arrays per frame behind for the collector. Does nothing
 * for frames whose reader makes new arrays each time.
 */
export function handBackArrays(frame: Frame): void {
  const takeBack = takeBacks.get(frame);
  if (!takeBack) return;
  takeBacks.delete(frame);
  takeBack();
}

/** Where a frame starts in the (decompressed) byte stream, for random access. */
export interface FrameOffset {
  index: number;
  /** Byte offset in the decompressed stream. */
  offset: number;
}

export type TrajectoryFormat = 'xyz' | 'extxyz' | 'pdb' | 'h5md';
export type Compression = 'none' | 'gzip' | 'zip';

/** Error raised by any reader: says what went wrong and where. */
export class TrajectoryFormatError extends Error {
  constructor(
    message: string,
    readonly where: { file?: string; frame?: number; line?: number; path?: string } = {},
  ) {
    super(formatWhere(message, where));
    this.name = 'TrajectoryFormatError';
  }
}

function formatWhere(message: string, where: TrajectoryFormatError['where']): string {
  const parts: string[] = [];
  if (where.file) parts.push(where.file);
  if (where.frame !== undefined) parts.push(`frame ${where.frame + 1}`);
  if (where.line !== undefined) parts.push(`line ${where.line}`);
  if (where.path) parts.push(`HDF5 path ${where.path}`);
  return parts.length ? `${parts.join(', ')}: ${message}` : message;
}
