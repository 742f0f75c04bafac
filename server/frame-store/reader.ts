/**
 * Reads the binary frame store: whole chunks in order for analyses (the
 * next chunk is fetched while the current one is used), and just the bytes
 * a frame range needs for the viewer. Frames come out in the shape every
 * text reader produces, in the file's units, so everything downstream
 * (assembly for the engine, the viewer payload, extended XYZ cuts) is shared.
 */
import type { Frame } from '../formats/frame.ts';
import { chunkSections, frameStoreIndexSchema, type ChunkSections, type FrameChunk, type FrameStoreIndex } from './layout.ts';

/** The part of the object store a reader needs. */
export interface ObjectSource {
  getBytes(key: string): Promise<Uint8Array>;
  /** `length` bytes from `start`. */
  getRange(key: string, start: number, length: number): Promise<Uint8Array>;
}

export type StoredFrame = Frame & { values?: Record<string, number> };

export interface FrameSelection {
  from?: number;
  /** One past the last frame. */
  to?: number;
  stride?: number;
}

/** Frame-wise metadata of a range, as the viewer's header wants it. */
export interface FrameInfo {
  index: number;
  time: number | null;
  cell: Float64Array | null;
}

export async function openFrameStore(source: ObjectSource, indexKey: string): Promise<FrameStore> {
  const bytes = await source.getBytes(indexKey);
  const parsed = frameStoreIndexSchema.safeParse(JSON.parse(Buffer.from(bytes).toString('utf8')));
  if (!parsed.success) throw new Error(`the frame store index ${indexKey} is not one this version reads: ${parsed.error.issues[0]?.message}`);
  return new FrameStore(source, parsed.data);
}

/** A typed-array view of bytes, copied first when they do not sit on the element size. */
function view<T extends Float32Array | Float64Array>(Type: { new (b: ArrayBuffer, o: number, l: number): T; BYTES_PER_ELEMENT: number }, bytes: Uint8Array, offset: number, length: number): T {
  const at = bytes.byteOffset + offset;
  if (at % Type.BYTES_PER_ELEMENT === 0) return new Type(bytes.buffer as ArrayBuffer, at, length);
  const copy = bytes.slice(offset, offset + length * Type.BYTES_PER_ELEMENT);
  return new Type(copy.buffer, 0, length);
}

export interface DecodedChunk {
  chunk: FrameChunk;
  positions: Float32Array;
  velocities: Float32Array | null;
  times: Float64Array | null;
  cells: Float64Array | null;
  values: Float64Array | null;
}

export class FrameStore {
  readonly species: string[];

  constructor(private readonly source: ObjectSource, readonly index: FrameStoreIndex) {
    this.species = index.speciesIndex.map((i) => index.speciesNames[i] ?? '?');
  }

  sections(chunk: FrameChunk): ChunkSections {
    return chunkSections(this.index.atoms, chunk);
  }

  /** The chunk holding a frame (binary search over first frames). */
  chunkOf(frame: number): number {
    const chunks = this.index.chunks;
    let lo = 0;
    let hi = chunks.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (chunks[mid]!.firstFrame <= frame) lo = mid;
      else hi = mid - 1;
    }
    return lo;
  }

  async readChunk(i: number): Promise<DecodedChunk> {
    const chunk = this.index.chunks[i]!;
    const bytes = await this.source.getBytes(chunk.key);
    const s = this.sections(chunk);
    if (bytes.length !== s.bytes) throw new Error(`frame store chunk ${chunk.key} has ${bytes.length} bytes, expected ${s.bytes}`);
    const n3 = this.index.atoms * 3;
    return {
      chunk,
      positions: view(Float32Array, bytes, s.positions.offset, chunk.frames * n3),
      velocities: s.velocities ? view(Float32Array, bytes, s.velocities.offset, chunk.frames * n3) : null,
      times: s.times ? view(Float64Array, bytes, s.times.offset, chunk.frames) : null,
      cells: s.cells ? view(Float64Array, bytes, s.cells.offset, chunk.frames * 9) : null,
      values: s.values ? view(Float64Array, bytes, s.values.offset, chunk.frames * chunk.valueKeys.length) : null,
    };
  }

  /**
   * Frames in [from, to) every `stride`-th, whole chunks at a time with the
   * next chunk on its way while this one is used. Positions and velocities
   * are views into the chunk: copy them to keep them past the next frame.
   */
  async *frames(selection: FrameSelection = {}): AsyncGenerator<StoredFrame> {
    const { from, to, stride } = this.resolve(selection);
    if (from >= to) return;
    const first = this.chunkOf(from);
    const last = this.chunkOf(to - 1);
    let next: Promise<DecodedChunk> | null = this.readChunk(first);
    for (let c = first; c <= last; c++) {
      const decoded = await next!;
      next = c < last ? this.readChunk(c + 1) : null;
      // Keep a failed prefetch from surfacing as an unhandled rejection if the caller stops early.
      next?.catch(() => {});
      const { chunk } = decoded;
      const start = Math.max(from, chunk.firstFrame);
      const firstWanted = start + ((stride - ((start - from) % stride)) % stride);
      for (let f = firstWanted; f < Math.min(to, chunk.firstFrame + chunk.frames); f += stride) yield this.frameOf(decoded, f - chunk.firstFrame);
    }
  }

  /**
   * Positions (and what the viewer shows beside them) for a frame range,
   * reading only those frames' bytes: one ranged read per run of wanted
   * frames inside a chunk, plus the chunk's times and cells.
   */
  async readPositions(selection: FrameSelection): Promise<{ frames: FrameInfo[]; positions: Float32Array }> {
    const { from, to, stride } = this.resolve(selection);
    const wanted: number[] = [];
    for (let f = from; f < to; f += stride) wanted.push(f);
    const n3 = this.index.atoms * 3;
    const positions = new Float32Array(wanted.length * n3);
    const frames: FrameInfo[] = new Array(wanted.length);
    const byChunk = new Map<number, number[]>();
    wanted.forEach((f, k) => {
      const c = this.chunkOf(f);
      const list = byChunk.get(c) ?? [];
      list.push(k);
      byChunk.set(c, list);
    });
    await Promise.all([...byChunk].map(async ([c, slots]) => {
      const chunk = this.index.chunks[c]!;
      const s = this.sections(chunk);
      const local = slots.map((k) => wanted[k]! - chunk.firstFrame);
      const lo = local[0]!;
      const hi = local[local.length - 1]!;
      // With a wide stride, reading the frames between costs more than separate reads.
      const contiguous = stride === 1 || (hi - lo + 1) <= 2 * local.length;
      const reads: Promise<void>[] = [];
      if (contiguous) {
        reads.push(this.source.getRange(chunk.key, s.positions.offset + lo * s.positions.stride, (hi - lo + 1) * s.positions.stride).then((bytes) => {
          const all = view(Float32Array, bytes, 0, (hi - lo + 1) * n3);
          slots.forEach((k, j) => positions.set(all.subarray((local[j]! - lo) * n3, (local[j]! - lo + 1) * n3), k * n3));
        }));
      } else {
        slots.forEach((k, j) => reads.push(this.source.getRange(chunk.key, s.positions.offset + local[j]! * s.positions.stride, s.positions.stride)
          .then((bytes) => positions.set(view(Float32Array, bytes, 0, n3), k * n3))));
      }
      const meta = async (section: typeof s.times, width: number): Promise<Float64Array | null> => {
        if (!section) return null;
        const bytes = await this.source.getRange(chunk.key, section.offset + lo * section.stride, (hi - lo + 1) * section.stride);
        return view(Float64Array, bytes, 0, (hi - lo + 1) * width);
      };
      const [times, cells] = await Promise.all([meta(s.times, 1), meta(s.cells, 9), ...reads]);
      slots.forEach((k, j) => {
        const at = local[j]! - lo;
        const time = times ? times[at]! : NaN;
        const cell = cells ? cells.slice(at * 9, at * 9 + 9) : null;
        frames[k] = { index: wanted[k]!, time: Number.isNaN(time) ? null : time, cell: cell && !Number.isNaN(cell[0]!) ? cell : null };
      });
    }));
    return { frames, positions };
  }

  private resolve(selection: FrameSelection): Required<FrameSelection> {
    const from = selection.from ?? 0;
    const to = Math.min(selection.to ?? this.index.frames, this.index.frames);
    const stride = selection.stride ?? 1;
    if (!Number.isInteger(from) || from < 0) throw new RangeError(`from must be a non-negative integer, got ${from}`);
    if (!Number.isInteger(stride) || stride < 1) throw new RangeError(`stride must be a positive integer, got ${stride}`);
    return { from, to, stride };
  }

  private frameOf(d: DecodedChunk, k: number): StoredFrame {
    const n3 = this.index.atoms * 3;
    const frame: StoredFrame = {
      index: d.chunk.firstFrame + k,
      positions: d.positions.subarray(k * n3, (k + 1) * n3),
      species: this.species,
      cell: null,
    };
    if (d.velocities && !Number.isNaN(d.velocities[k * n3]!)) frame.velocities = d.velocities.subarray(k * n3, (k + 1) * n3);
    if (d.cells && !Number.isNaN(d.cells[k * 9]!)) frame.cell = d.cells.subarray(k * 9, k * 9 + 9);
    if (d.times && !Number.isNaN(d.times[k]!)) frame.time = d.times[k]!;
    if (this.index.pbc) frame.pbc = this.index.pbc;
    if (d.values) {
      const keys = d.chunk.valueKeys;
      const values: Record<string, number> = {};
      keys.forEach((key, j) => {
        const v = d.values![k * keys.length + j]!;
        if (!Number.isNaN(v)) values[key] = v;
      });
      frame.values = values;
    }
    return frame;
  }
}
