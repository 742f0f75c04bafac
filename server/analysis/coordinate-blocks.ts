/**
 * Coordinates too big to hold: a trajectory may keep its positions and
 * velocities outside memory (a local block file, see server/out-of-core/)
 * and hand the engine only a `CoordinateBlocks`. The engine then reads
 * them either an atom chunk at a time (every frame of a few atoms: MSD,
 * VACF, VDOS, α₂, Lindemann) or a frame block at a time (every atom of a
 * few frames: thermo, g(r), energy). Either way each number read is the
 * same Float32 value the whole array holds, and each sum runs in the same
 * order, so results are identical to the in-memory path.
 *
 * The cursors below serve both cases with one interface.
 */
import type { Trajectory } from './trajectory.ts';

export type CoordinateKind = 'positions' | 'velocities';

export interface CoordinateBlocks {
  readonly nAtoms: number;
  readonly nFrames: number;
  /** Frames per block (the last block may hold fewer). */
  readonly blockFrames: number;
  /** Atoms read together by an atom cursor, chosen so one chunk stays within the engine's memory budget. */
  readonly atomsPerChunk: number;
  /** Every frame of atoms [from, to), atom-major: out[(a − from)·3T + 3t + c]. */
  readAtoms(kind: CoordinateKind, from: number, to: number): Float32Array;
  /** Block `block`, frame-major: out[(t − block·blockFrames)·3N + 3a + c]. */
  readFrameBlock(kind: CoordinateKind, block: number): Float32Array;
}

/** Where one atom's series lies: value of frame t, component c is data[base + t·stride + c]. */
export interface AtomSpan {
  data: Float32Array;
  base: number;
  stride: number;
}

const EMPTY = new Float32Array(0);

/**
 * An atom chunk gathered from an in-memory trajectory: at most this many
 * bytes, and few enough atoms that the gather writes only a handful of
 * rows at once while each frame's read is still a few whole cache lines.
 */
const IN_MEMORY_CHUNK_BYTES = 4 * 1024 * 1024;
const IN_MEMORY_CHUNK_ATOMS = 16;

/**
 * One atom's whole series at a time, read an atom chunk at a time (one
 * chunk kept): from the blocks, or gathered from the frame-major array in
 * memory, so that the per-atom loops run over contiguous values instead of
 * touching one cache line per frame.
 */
export class AtomCursor {
  private readonly whole: Float32Array | null;
  private readonly atomsPerChunk: number;
  private chunk: Float32Array = EMPTY;
  private chunkFrom = -1;
  private chunkTo = -1;
  private readonly span: AtomSpan = { data: EMPTY, base: 0, stride: 3 };

  constructor(private readonly traj: Trajectory, private readonly kind: CoordinateKind) {
    const array = kind === 'positions' ? traj.positions : traj.velocities;
    if (!array) throw new Error(`the trajectory has no ${kind}`);
    this.whole = traj.blocks ? null : array;
    this.atomsPerChunk = traj.blocks
      ? traj.blocks.atomsPerChunk
      : Math.max(1, Math.min(traj.nAtoms, IN_MEMORY_CHUNK_ATOMS, Math.floor(IN_MEMORY_CHUNK_BYTES / (12 * Math.max(1, traj.nFrames)))));
  }

  at(atom: number): AtomSpan {
    if (atom < this.chunkFrom || atom >= this.chunkTo) {
      const from = Math.floor(atom / this.atomsPerChunk) * this.atomsPerChunk;
      const to = Math.min(this.traj.nAtoms, from + this.atomsPerChunk);
      if (this.whole) {
        // Gathered into the same buffer chunk after chunk: a pass over the atoms leaves no trail of them for the collector.
        const length = this.atomsPerChunk * 3 * this.traj.nFrames;
        if (this.chunk.length !== length) this.chunk = new Float32Array(length);
        gatherAtoms(this.whole, this.traj.nAtoms, this.traj.nFrames, from, to, this.chunk);
      } else {
        // Drop the old chunk before reading the next, so two are never held at once.
        this.chunk = this.span.data = EMPTY;
        this.chunk = this.traj.blocks!.readAtoms(this.kind, from, to);
      }
      this.chunkFrom = from;
      this.chunkTo = to;
    }
    const span = this.span;
    span.data = this.chunk;
    span.base = (atom - this.chunkFrom) * 3 * this.traj.nFrames;
    return span;
  }
}

/**
 * Atoms [from, to) of a frame-major array, atom-major, into out[(a − from)·3T + 3t + c].
 * Atom by atom, so the writes run straight through the output: the first
 * atom brings the chunk's few cache lines of each frame in, and the
 * chunk's other atoms find them still cached.
 */
function gatherAtoms(x: Float32Array, N: number, T: number, from: number, to: number, out: Float32Array): void {
  const atoms = to - from;
  const stride = 3 * N;
  for (let a = 0; a < atoms; a++) {
    let p = 3 * (from + a);
    let o = a * 3 * T;
    for (let t = 0; t < T; t++, p += stride, o += 3) {
      out[o] = x[p];
      out[o + 1] = x[p + 1];
      out[o + 2] = x[p + 2];
    }
  }
}

/** Blocks kept by a frame cursor: a frame and its two neighbours touch at most three. */
const FRAME_BLOCKS_KEPT = 3;

/** Every atom of one frame at a time, from memory or from frame blocks (the last few kept). */
export class FrameCursor {
  private readonly whole: Float32Array | null;
  private readonly kept = new Map<number, Float32Array>();

  constructor(private readonly traj: Trajectory, private readonly kind: CoordinateKind) {
    const array = kind === 'positions' ? traj.positions : traj.velocities;
    if (!array) throw new Error(`the trajectory has no ${kind}`);
    this.whole = traj.blocks ? null : array;
  }

  /** The 3N values of frame f: data[offset + 3a + c]. */
  frame(f: number): { data: Float32Array; offset: number } {
    const n3 = 3 * this.traj.nAtoms;
    if (this.whole) return { data: this.whole, offset: n3 * f };
    const blocks = this.traj.blocks!;
    const b = Math.floor(f / blocks.blockFrames);
    let data = this.kept.get(b);
    if (!data) {
      if (this.kept.size >= FRAME_BLOCKS_KEPT) this.kept.delete(this.kept.keys().next().value!);
      data = blocks.readFrameBlock(this.kind, b);
      this.kept.set(b, data);
    }
    return { data, offset: n3 * (f - b * blocks.blockFrames) };
  }
}

/** Checks that a trajectory's coordinate arrays (or blocks) cover atoms × frames. */
export function checkCoordinateShape(traj: Trajectory): void {
  if (traj.blocks) {
    if (traj.blocks.nAtoms !== traj.nAtoms || traj.blocks.nFrames !== traj.nFrames) throw new Error('Coordinate blocks do not match atoms × frames.');
    return;
  }
  if (traj.positions.length !== traj.nFrames * traj.nAtoms * 3) throw new Error('Position array length does not match atoms × frames × 3.');
  if (traj.velocities && traj.velocities.length !== traj.positions.length) throw new Error('Velocity array length does not match positions.');
}
