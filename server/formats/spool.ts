/**
 * HDF5 needs random access, so H5MD that arrives as a stream (an upload,
 * or inside gzip/zip) is written to a private temp directory first. The
 * write is bounded by the decompressed-size limit; the directory is removed
 * when the reader is done.
 */
import { mkdtemp, open, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
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
    const handle = await open(path, 'wx', 0o600);
    try {
      let written = 0;
      for await (const chunk of source) {
        written += chunk.length;
        if (written > limits.maxDecompressedBytes) {
          throw new TrajectoryFormatError(`HDF5 data exceeds the limit of ${limits.maxDecompressedBytes} bytes`, { file });
        }
        await handle.write(chunk);
      }
    } finally {
      await handle.close();
    }
  } catch (error) {
    await remove();
    throw error;
  }
  return { path, remove };
}
