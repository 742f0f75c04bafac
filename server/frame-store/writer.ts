/**
 * Writes the binary frame store while inspection streams through a file:
 * frames are copied into a chunk buffer and each full chunk is stored while
 * the next one fills, so memory stays at about two chunks whatever the
 * file's length.
 */
import { TrajectoryFormatError, type Frame } from '../formats/frame.ts';
import {
  chunkName, chunkSections, DEFAULT_CHUNK_BYTES, FRAME_STORE_FORMAT, FRAME_STORE_VERSION, framesPerChunk, INDEX_NAME,
  type FrameChunk, type FrameStoreIndex,
} from './layout.ts';

/** The part of the object store a writer needs. */
export interface ObjectSink {
  putBytes(key: string, body: Uint8Array, contentType?: string): Promise<void>;
  deletePrefix(prefix: string): Promise<number>;
}

export interface FrameStoreWriterOptions {
  /** Target size of positions and velocities per chunk (tests use small ones). */
  chunkBytes?: number;
  /** Name for error messages. */
  file?: string;
}

/** A frame that also states other per-frame numbers (energies and the like), when its reader found them. */
type StoredFrame = Frame & { values?: Record<string, number> };

interface OpenChunk {
  firstFrame: number;
  frames: number;
  positions: Float32Array;
  velocities: Float32Array | null;
  times: Float64Array;
  cells: Float64Array;
  anyTime: boolean;
  anyCell: boolean;
  values: Map<string, Float64Array>;
}

const FLOAT32_MAX = 3.4028234663852886e38;

export class FrameStoreWriter {
  private atoms = 0;
  private speciesNames: string[] = [];
  private speciesIndex: number[] = [];
  private perChunk = 0;
  private frames = 0;
  private open: OpenChunk | null = null;
  private readonly chunks: FrameChunk[] = [];
  private pending: Promise<void> = Promise.resolve();
  private bytes = 0;
  private hasVelocities = true;
  private timed = true;
  private hasCell = true;
  private pbc: [boolean, boolean, boolean] | null = null;

  constructor(private readonly sink: ObjectSink, readonly prefix: string, private readonly options: FrameStoreWriterOptions = {}) {}

  async add(frame: StoredFrame): Promise<void> {
    if (this.frames === 0) this.begin(frame);
    if (frame.species.length !== this.atoms) {
      throw new TrajectoryFormatError(`frame has ${frame.species.length} atoms but the first frame has ${this.atoms}`, { file: this.options.file, frame: frame.index });
    }
    const chunk = (this.open ??= this.newChunk(frame));
    const k = chunk.frames;
    const n3 = this.atoms * 3;
    chunk.positions.set(frame.positions, k * n3);
    this.checkFloat32(chunk.positions, k * n3, frame.index, 'coordinate');
    if (chunk.velocities) {
      if (frame.velocities) {
        chunk.velocities.set(frame.velocities, k * n3);
        this.checkFloat32(chunk.velocities, k * n3, frame.index, 'velocity');
      } else chunk.velocities.fill(NaN, k * n3, (k + 1) * n3);
    }
    if (!frame.velocities) this.hasVelocities = false;
    if (frame.time !== undefined) {
      chunk.times[k] = frame.time;
      chunk.anyTime = true;
    } else this.timed = false;
    if (frame.cell) {
      chunk.cells.set(frame.cell, k * 9);
      chunk.anyCell = true;
    } else this.hasCell = false;
    if (frame.values) {
      for (const key in frame.values) {
        let series = chunk.values.get(key);
        if (!series) chunk.values.set(key, (series = new Float64Array(this.perChunk).fill(NaN)));
        series[k] = frame.values[key]!;
      }
    }
    chunk.frames++;
    this.frames++;
    if (chunk.frames === this.perChunk) await this.flush();
  }

  /** Stores the last chunk and the index; returns the index and the bytes stored in all. */
  async finish(): Promise<{ index: FrameStoreIndex; storedBytes: number }> {
    if (this.frames === 0) throw new TrajectoryFormatError('no frames to store', { file: this.options.file });
    await this.flush();
    await this.pending;
    const index: FrameStoreIndex = {
      format: FRAME_STORE_FORMAT, version: FRAME_STORE_VERSION, atoms: this.atoms, frames: this.frames,
      speciesNames: this.speciesNames, speciesIndex: this.speciesIndex,
      hasVelocities: this.hasVelocities, timed: this.timed, hasCell: this.hasCell, pbc: this.pbc,
      chunks: this.chunks, bytes: this.bytes,
    };
    const body = Buffer.from(JSON.stringify(index));
    await this.sink.putBytes(this.indexKey, body, 'application/json');
    return { index, storedBytes: this.bytes + body.length };
  }

  /** Removes whatever was stored (a failed inspection leaves no half store). */
  async abort(): Promise<void> {
    await this.pending.catch(() => {});
    await this.sink.deletePrefix(this.prefix);
  }

  get indexKey(): string {
    return `${this.prefix}${INDEX_NAME}`;
  }

  private begin(frame: StoredFrame): void {
    this.atoms = frame.species.length;
    if (this.atoms === 0) throw new TrajectoryFormatError('frame has no atoms', { file: this.options.file, frame: frame.index });
    const names = new Map<string, number>();
    this.speciesIndex = frame.species.map((s) => {
      let i = names.get(s);
      if (i === undefined) names.set(s, (i = names.size));
      return i;
    });
    this.speciesNames = [...names.keys()];
    this.perChunk = framesPerChunk(this.atoms, frame.velocities !== undefined, this.options.chunkBytes ?? DEFAULT_CHUNK_BYTES);
    this.pbc = frame.pbc ?? null;
  }

  private newChunk(first: StoredFrame): OpenChunk {
    const n3 = this.atoms * 3;
    return {
      firstFrame: this.frames, frames: 0,
      positions: new Float32Array(this.perChunk * n3),
      velocities: first.velocities ? new Float32Array(this.perChunk * n3) : null,
      times: new Float64Array(this.perChunk).fill(NaN),
      cells: new Float64Array(this.perChunk * 9).fill(NaN),
      anyTime: false, anyCell: false, values: new Map(),
    };
  }

  private checkFloat32(values: Float32Array, from: number, frame: number, what: string): void {
    for (let i = from, end = from + this.atoms * 3; i < end; i++) {
      const v = values[i]!;
      if (!(v <= FLOAT32_MAX && v >= -FLOAT32_MAX)) {
        const atom = Math.floor((i - from) / 3) + 1;
        throw new TrajectoryFormatError(`atom ${atom}: a ${what} is beyond what 32-bit floats hold (±3.4e38) or not a number`, { file: this.options.file, frame });
      }
    }
  }

  private async flush(): Promise<void> {
    const chunk = this.open;
    if (!chunk || chunk.frames === 0) return;
    this.open = null;
    const valueKeys = [...chunk.values.keys()];
    const entry: FrameChunk = {
      key: `${this.prefix}${chunkName(this.chunks.length)}`, firstFrame: chunk.firstFrame, frames: chunk.frames,
      velocities: chunk.velocities !== null, times: chunk.anyTime, cells: chunk.anyCell, valueKeys, bytes: 0,
    };
    const sections = chunkSections(this.atoms, entry);
    const body = new Uint8Array(sections.bytes);
    const n3 = this.atoms * 3;
    const copy = (section: { offset: number } | null, values: Float32Array | Float64Array, length: number) => {
      if (section) body.set(new Uint8Array(values.buffer, values.byteOffset, length * values.BYTES_PER_ELEMENT), section.offset);
    };
    copy(sections.positions, chunk.positions, chunk.frames * n3);
    if (chunk.velocities) copy(sections.velocities, chunk.velocities, chunk.frames * n3);
    if (entry.times) copy(sections.times, chunk.times, chunk.frames);
    if (entry.cells) copy(sections.cells, chunk.cells, chunk.frames * 9);
    if (sections.values) {
      const table = new Float64Array(chunk.frames * valueKeys.length);
      valueKeys.forEach((key, j) => {
        const series = chunk.values.get(key)!;
        for (let f = 0; f < chunk.frames; f++) table[f * valueKeys.length + j] = series[f]!;
      });
      copy(sections.values, table, table.length);
    }
    entry.bytes = body.length;
    this.bytes += body.length;
    this.chunks.push(entry);
    // One chunk is stored while the next one fills; a failed store surfaces at the next flush.
    await this.pending;
    this.pending = this.sink.putBytes(entry.key, body);
  }
}
