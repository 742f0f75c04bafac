/**
 * A local scratch file that holds a trajectory's positions and velocities
 * when they are too big for memory, transposed once on the way in so the
 * engine can read every frame of a few atoms (MSD, VACF, VDOS, α₂) with one
 * read per block, and every atom of a few frames just as cheaply.
 *
 * The file is a run of blocks of `blockFrames` frames. Block b starts at
 * b·blockBytes and holds, Float32 in the machine's byte order:
 *
 *   positions   atoms × blockFrames × 3   (atom-major: each atom's frames together)
 *   velocities  atoms × blockFrames × 3   (when the trajectory has them)
 *
 * The last block is laid out at full size with only its frames filled.
 * Frames arrive in order, one at a time, into a frame-major staging block
 * that is transposed and written when full: memory is one block plus one
 * atom chunk, whatever the length of the run.
 */
import { closeSync, openSync, readSync, writeSync } from 'node:fs';
import { randomBytes } from 'node:crypto';
import { join } from 'node:path';
import type { CoordinateBlocks, CoordinateKind } from '../analysis/coordinate-blocks.ts';

/** Bytes of one block (positions and velocities together): big enough for few reads, small beside the budget. */
export const BLOCK_BYTES = 4 * 1024 * 1024;
/** Bytes of one atom chunk the engine holds at a time (per kind). */
export const ATOM_CHUNK_BYTES = 16 * 1024 * 1024;

/** Everything needed to open a block file again, in this process or another thread. */
export interface BlockFileLayout {
  path: string;
  nAtoms: number;
  nFrames: number;
  blockFrames: number;
  hasVelocities: boolean;
  /** Atoms per chunk the engine reads at once; by default as many as fit `ATOM_CHUNK_BYTES`. */
  atomsPerChunk?: number;
}

/** Sizes other than the defaults, e.g. tiny blocks so that a short run still crosses block seams. */
export interface BlockSizes {
  blockFrames?: number;
  atomsPerChunk?: number;
}

export function blockFramesFor(nAtoms: number, hasVelocities: boolean): number {
  return Math.max(1, Math.floor(BLOCK_BYTES / (nAtoms * 12 * (hasVelocities ? 2 : 1))));
}

export class BlockFileWriter {
  readonly path: string;
  readonly blockFrames: number;
  /** Frame-major staging of the block being filled; a frame's values go at `slot()`. */
  readonly positions: Float32Array;
  readonly velocities: Float32Array | null;
  private readonly transposed: Float32Array;
  private readonly fd: number;
  private staged = 0;
  private frames = 0;
  private block = 0;

  constructor(directory: string, readonly nAtoms: number, readonly hasVelocities: boolean, private readonly sizes: BlockSizes = {}) {
    this.path = join(directory, `coordinates-${randomBytes(6).toString('hex')}.f32`);
    this.blockFrames = sizes.blockFrames ?? blockFramesFor(nAtoms, hasVelocities);
    const n = this.blockFrames * nAtoms * 3;
    this.positions = new Float32Array(n);
    this.velocities = hasVelocities ? new Float32Array(n) : null;
    this.transposed = new Float32Array(hasVelocities ? 2 * n : n);
    this.fd = openSync(this.path, 'w', 0o600);
  }

  /** Offset in `positions` / `velocities` where the next frame's 3N values go. */
  slot(): number {
    return this.staged * this.nAtoms * 3;
  }

  /** The frame at `slot()` is filled in. */
  commit(): void {
    this.staged++;
    this.frames++;
    if (this.staged === this.blockFrames) this.flush();
  }

  /** Writes what is staged and closes the file; the layout opens it for reading. */
  finish(): BlockFileLayout {
    if (this.staged > 0) this.flush();
    closeSync(this.fd);
    const layout: BlockFileLayout = { path: this.path, nAtoms: this.nAtoms, nFrames: this.frames, blockFrames: this.blockFrames, hasVelocities: this.hasVelocities };
    if (this.sizes.atomsPerChunk) layout.atomsPerChunk = this.sizes.atomsPerChunk;
    return layout;
  }

  /** Closes the file after a failure; the caller removes its directory. */
  abandon(): void {
    closeSync(this.fd);
  }

  private flush(): void {
    const N = this.nAtoms, F = this.blockFrames, part = N * F * 3;
    transposeInto(this.positions, this.staged, N, F, this.transposed, 0);
    if (this.velocities) transposeInto(this.velocities, this.staged, N, F, this.transposed, part);
    const bytes = new Uint8Array(this.transposed.buffer, 0, this.transposed.byteLength);
    let written = 0;
    const at = this.block * bytes.byteLength;
    while (written < bytes.byteLength) written += writeSync(this.fd, bytes, written, bytes.byteLength - written, at + written);
    this.block++;
    this.staged = 0;
  }
}

/** Frame-major [t][a][c] (t < frames) → atom-major [a][t][c] with room for F frames per atom. */
function transposeInto(source: Float32Array, frames: number, N: number, F: number, out: Float32Array, base: number): void {
  for (let t = 0; t < frames; t++) {
    const from = t * N * 3;
    for (let a = 0; a < N; a++) {
      const s = from + 3 * a, o = base + (a * F + t) * 3;
      out[o] = source[s];
      out[o + 1] = source[s + 1];
      out[o + 2] = source[s + 2];
    }
  }
}

/** The engine's view of a block file: synchronous reads of atom chunks and frame blocks. */
export class BlockFileReader implements CoordinateBlocks {
  readonly nAtoms: number;
  readonly nFrames: number;
  readonly blockFrames: number;
  readonly atomsPerChunk: number;
  private readonly blockBytes: number;
  private readonly partBytes: number;

  constructor(readonly layout: BlockFileLayout) {
    this.nAtoms = layout.nAtoms;
    this.nFrames = layout.nFrames;
    this.blockFrames = layout.blockFrames;
    this.atomsPerChunk = Math.max(1, Math.min(layout.nAtoms, layout.atomsPerChunk ?? Math.floor(ATOM_CHUNK_BYTES / (layout.nFrames * 12))));
    this.partBytes = layout.nAtoms * layout.blockFrames * 12;
    this.blockBytes = this.partBytes * (layout.hasVelocities ? 2 : 1);
  }

  readAtoms(kind: CoordinateKind, from: number, to: number): Float32Array {
    const T = this.nFrames, F = this.blockFrames, atoms = to - from;
    const out = new Float32Array(atoms * 3 * T);
    const staging = new Float32Array(atoms * F * 3);
    const blocks = Math.ceil(T / F);
    this.withFile((fd) => {
      for (let b = 0; b < blocks; b++) {
        const frames = Math.min(F, T - b * F);
        this.read(fd, staging, b * this.blockBytes + this.partOffset(kind) + from * F * 12);
        for (let a = 0; a < atoms; a++) {
          out.set(staging.subarray(a * F * 3, (a * F + frames) * 3), a * 3 * T + 3 * b * F);
        }
      }
    });
    return out;
  }

  readFrameBlock(kind: CoordinateKind, block: number): Float32Array {
    const N = this.nAtoms, F = this.blockFrames;
    const frames = Math.min(F, this.nFrames - block * F);
    const staging = new Float32Array(N * F * 3);
    this.withFile((fd) => this.read(fd, staging, block * this.blockBytes + this.partOffset(kind)));
    const out = new Float32Array(frames * N * 3);
    for (let a = 0; a < N; a++) {
      for (let t = 0; t < frames; t++) {
        const s = (a * F + t) * 3, o = (t * N + a) * 3;
        out[o] = staging[s];
        out[o + 1] = staging[s + 1];
        out[o + 2] = staging[s + 2];
      }
    }
    return out;
  }

  /**
   * Opened for each read and closed after it: a reader lives in an engine
   * thread that may be ended at any moment, and an open descriptor would
   * outlive the thread and keep the deleted file's space taken.
   */
  private withFile(use: (fd: number) => void): void {
    const fd = openSync(this.layout.path, 'r');
    try {
      use(fd);
    } finally {
      closeSync(fd);
    }
  }

  private partOffset(kind: CoordinateKind): number {
    if (kind === 'velocities' && !this.layout.hasVelocities) throw new Error('the trajectory has no velocities');
    return kind === 'velocities' ? this.partBytes : 0;
  }

  private read(fd: number, into: Float32Array, position: number): void {
    const bytes = new Uint8Array(into.buffer, into.byteOffset, into.byteLength);
    let done = 0;
    while (done < bytes.byteLength) {
      const n = readSync(fd, bytes, done, bytes.byteLength - done, position + done);
      // The last block is written at full size, so a short read means the file was cut.
      if (n === 0) throw new Error(`the coordinate scratch file ${this.layout.path} ends early`);
      done += n;
    }
  }
}
