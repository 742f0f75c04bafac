/**
 * HDF5 needs random access, so H5MD that arrives as a stream (an upload,
 * or inside gzip/zip) is written to a private temp directory first. The
 * write is bounded by the smaller of the temp-file limit and the
 * decompressed-size limit, checked before each chunk reaches the disk; the
 * directory is removed when the reader is done, fails or is stopped.
 */
import { mkdtemp, open, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { formatBytes } from '../../shared/byte-size.ts';
import { TrajectoryFormatError } from './frame.ts';
import type { ResolvedLimits } from './limits.ts';

export interface SpooledFile {
  path: string;
  remove(): Promise<void>;
}

export async function spoolToTempFile(source: AsyncIterable<Buffer>, limits: ResolvedLimits, file: string): Promise<SpooledFile> {
  const dir = await mkdtemp(join(limits.tempDir ?? tmpdir(), 'ergodic-h5md-'));
  const remove = () => rm(dir, { recursive: true, force: true });
  const path = join(dir, 'trajectory.h5');
  try {
    await spoolTo(path, source, limits, file);
  } catch (error) {
    await remove();
    throw error;
  }
  return { path, remove };
}

/**
 * Writes a stream to a new file at `path` under the same bounds; a file
 * left half-written by a refusal or a failed read is the caller's to remove.
 */
export async function spoolTo(path: string, source: AsyncIterable<Buffer>, limits: ResolvedLimits, file: string): Promise<void> {
  const handle = await open(path, 'wx', 0o600);
  try {
    let written = 0;
    for await (const chunk of source) {
      written += chunk.length;
      if (written > limits.maxTempFileBytes || written > limits.maxDecompressedBytes) throw tooLarge(written, limits, file);
      await handle.write(chunk);
    }
  } finally {
    await handle.close();
  }
}

/** Names the limit that was reached, in bytes and as people read them, and the setting that raises it. */
function tooLarge(written: number, limits: ResolvedLimits, file: string): TrajectoryFormatError {
  const temp = limits.maxTempFileBytes <= limits.maxDecompressedBytes;
  const limit = temp ? limits.maxTempFileBytes : limits.maxDecompressedBytes;
  const which = temp ? 'the temporary-file limit (JOB_TEMP_MAX_BYTES)' : 'the decompressed-size limit (DECOMPRESSED_MAX_BYTES)';
  return new TrajectoryFormatError(
    `HDF5 data needs a temporary copy of more than ${limit} bytes (${formatBytes(limit)}, ${which}); refused on reaching ${written} bytes`,
    { file },
  );
}
