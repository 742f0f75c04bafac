/**
 * The engine's input: a whole trajectory held as flat typed arrays in the
 * engine's units (Å, ps, amu). Float32 storage keeps a 500-atom × 4000-frame
 * run at 24 MB; every long sum in the engine accumulates in Float64.
 */
import type { CoordinateBlocks } from './coordinate-blocks.ts';

export interface Trajectory {
  nAtoms: number;
  nFrames: number;
  /** Element symbol per atom, length nAtoms. */
  species: string[];
  /** Positions, frame-major: [frame][atom][xyz], length nFrames·nAtoms·3, in Å. */
  positions: Float32Array;
  /** Velocities in Å/ps with the same layout, when the file had them. */
  velocities?: Float32Array;
  /**
   * Cell per frame as lattice-vector rows (9 numbers a frame), in Å, or null
   * when there is no periodic cell. Orthorhombic cells are the common case;
   * the engine handles general triclinic cells where it says so.
   */
  cells: Float64Array | null;
  /** Time of each frame in ps, length nFrames (evenly spaced is assumed by the correlators). */
  times: Float64Array;
  /** 'periodic' unwraps and uses minimum image; 'walls' and 'none' do not. */
  boundary: 'periodic' | 'walls' | 'none';
  /**
   * With a 'periodic' boundary, which lattice directions (a, b, c) repeat,
   * when not all do: a slab between walls is [true, true, false]. Absent
   * means all three. Unwrapping and the minimum image act only along these.
   */
  periodicAxes?: [boolean, boolean, boolean];
  /**
   * Per-frame numbers the file carries besides coordinates (extended XYZ
   * comment keys such as energy=…, H5MD observables), by lower-case key,
   * each of length nFrames (NaN where a frame lacks the key). Units are the
   * file's; the energy analysis converts the ones the user mapped.
   */
  observables?: Record<string, Float64Array>;
  /**
   * Set when positions and velocities are too big to hold: they are then
   * read from these blocks, and `positions` (and `velocities`, when the
   * file had them) are empty arrays that only say what exists. Engine code
   * reads coordinates through AtomCursor and FrameCursor, which serve both.
   */
  blocks?: CoordinateBlocks;
}
