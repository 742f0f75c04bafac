/**
 * The bytes of an upload with its compression (gzip, or a zip holding one
 * file) undone, under the same bomb guards as every reader.
 */
import type { Compression } from './frame.ts';
import type { ResolvedLimits } from './limits.ts';
import { chunksOf, peek, type ByteSource } from './sources.ts';
import { DETECT_BYTES, detectCompression } from './detect.ts';
import { gunzip, unzipSingle } from './decompress.ts';

export interface DecodedBytes {
  compression: Compression;
  /** For messages: the upload's name, with the entry's for a zip archive (known once the stream has begun). */
  file(): string;
  bytes: AsyncGenerator<Buffer>;
}

export async function decodedBytes(source: ByteSource, name: string, limits: ResolvedLimits): Promise<DecodedBytes> {
  const { head, rest } = await peek(chunksOf(source), DETECT_BYTES);
  const compression = detectCompression(head);
  const entry: { name?: string } = {};
  const bytes = compression === 'gzip' ? gunzip(rest, limits, name) : compression === 'zip' ? unzipSingle(rest, limits, name, entry) : rest;
  return { compression, bytes, file: () => (entry.name ? `${name}/${entry.name}` : name) };
}
