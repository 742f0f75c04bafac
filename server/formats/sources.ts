/**
 * Byte sources: everything the readers consume is an async iterable of
 * Buffers, whether it came from a path, a Node stream or a test array.
 */
import { createReadStream } from 'node:fs';
import { open } from 'node:fs/promises';

/** Bytes of a trajectory: a file path, a Node Readable, or any async iterable of chunks. */
export type ByteSource = string | AsyncIterable<Uint8Array | string>;

/** Chunk size for local files: large reads keep the parsers in their hot loop. */
const FILE_CHUNK_BYTES = 1024 * 1024;

export function asBuffer(chunk: Uint8Array | string): Buffer {
  if (typeof chunk === 'string') return Buffer.from(chunk, 'utf8');
  return Buffer.isBuffer(chunk) ? chunk : Buffer.from(chunk.buffer, chunk.byteOffset, chunk.byteLength);
}

/** Spare read buffers a pool keeps: the line reader holds at most one chunk while the next is read. */
const POOL_SPARES = 2;

/**
 * Read buffers of a file read once in order. A consumer that has copied
 * what it needs of a chunk hands it back and the next read refills it, so
 * reading a file leaves no trail of megabyte buffers for the collector
 * (which otherwise lets tens of them pile up before it runs). Chunks nobody
 * hands back are simply dropped, as without a pool.
 */
export class ChunkPool {
  private readonly spares: Buffer[] = [];
  /** Each chunk handed out → the whole buffer it views; only these are taken back. */
  private readonly out = new WeakMap<Buffer, Buffer>();

  /** A whole buffer to read into. */
  take(): Buffer {
    return this.spares.pop() ?? Buffer.allocUnsafeSlow(FILE_CHUNK_BYTES);
  }

  /** Records `chunk` (a view of `whole`) as handed out. */
  lend(chunk: Buffer, whole: Buffer): Buffer {
    this.out.set(chunk, whole);
    return chunk;
  }

  /** Takes back a chunk this pool handed out, once nothing refers to its bytes any more; anything else is ignored. */
  giveBack(chunk: Buffer): void {
    const whole = this.out.get(chunk);
    if (!whole) return;
    this.out.delete(chunk);
    if (this.spares.length < POOL_SPARES) this.spares.push(whole);
  }
}

/**
 * Chunks of a file or stream from byte `start` (files only). With a pool, a
 * file is read on demand into the pool's buffers, never ahead, so a buffer
 * handed back is not being filled while its old bytes are still in use.
 */
export async function* chunksOf(source: ByteSource, start = 0, pool?: ChunkPool): AsyncGenerator<Buffer> {
  if (pool && typeof source === 'string') {
    yield* pooledFileChunks(source, start, pool);
    return;
  }
  const iterable =
    typeof source === 'string' ? createReadStream(source, { start, highWaterMark: FILE_CHUNK_BYTES }) : source;
  for await (const chunk of iterable) {
    const buf = asBuffer(chunk as Uint8Array | string);
    if (buf.length) yield buf;
  }
}

async function* pooledFileChunks(path: string, start: number, pool: ChunkPool): AsyncGenerator<Buffer> {
  const handle = await open(path, 'r');
  try {
    for (let position = start; ;) {
      const whole = pool.take();
      const { bytesRead } = await handle.read(whole, 0, whole.length, position);
      if (bytesRead === 0) return;
      position += bytesRead;
      yield pool.lend(whole.subarray(0, bytesRead), whole);
    }
  } finally {
    await handle.close();
  }
}

/** Counts bytes as they pass, for progress and compression-ratio checks. */
export class ByteCounter {
  bytes = 0;
  async *count(source: AsyncIterable<Buffer>): AsyncGenerator<Buffer> {
    for await (const chunk of source) {
      this.bytes += chunk.length;
      yield chunk;
    }
  }
}

/**
 * Reads at least `want` bytes (fewer only at end of stream) without losing
 * them: the returned `rest` replays the peeked chunks, then the remainder.
 */
export async function peek(
  source: AsyncIterable<Buffer>,
  want: number,
): Promise<{ head: Buffer; rest: AsyncGenerator<Buffer> }> {
  const iterator = source[Symbol.asyncIterator]();
  const taken: Buffer[] = [];
  let total = 0;
  let finished = false;
  while (total < want) {
    const next = await iterator.next();
    if (next.done) {
      finished = true;
      break;
    }
    taken.push(next.value);
    total += next.value.length;
  }
  async function* rest(): AsyncGenerator<Buffer> {
    try {
      yield* taken;
      taken.length = 0;
      if (finished) return;
      for (;;) {
        const next = await iterator.next();
        if (next.done) return;
        yield next.value;
      }
    } finally {
      if (!finished) await iterator.return?.();
    }
  }
  // One chunk (a file's first 1 MB read) is the head as it is, not a copy.
  return { head: taken.length === 1 ? taken[0]! : Buffer.concat(taken, total), rest: rest() };
}
