/**
 * Byte sources: everything the readers consume is an async iterable of
 * Buffers, whether it came from a path, a Node stream or a test array.
 */
import { createReadStream } from 'node:fs';

/** Bytes of a trajectory: a file path, a Node Readable, or any async iterable of chunks. */
export type ByteSource = string | AsyncIterable<Uint8Array | string>;

/** Chunk size for local files: large reads keep the parsers in their hot loop. */
const FILE_CHUNK_BYTES = 1024 * 1024;

export function asBuffer(chunk: Uint8Array | string): Buffer {
  if (typeof chunk === 'string') return Buffer.from(chunk, 'utf8');
  return Buffer.isBuffer(chunk) ? chunk : Buffer.from(chunk.buffer, chunk.byteOffset, chunk.byteLength);
}

export async function* chunksOf(source: ByteSource, start = 0): AsyncGenerator<Buffer> {
  const iterable =
    typeof source === 'string' ? createReadStream(source, { start, highWaterMark: FILE_CHUNK_BYTES }) : source;
  for await (const chunk of iterable) {
    const buf = asBuffer(chunk as Uint8Array | string);
    if (buf.length) yield buf;
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
