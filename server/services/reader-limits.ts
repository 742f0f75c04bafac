import type { Config } from '../config.ts';
import type { ReaderLimits } from '../formats/limits.ts';

/** The site's configured bounds for reading uploads; `tempDir` is the job's own temp folder when there is one. */
export function readerLimits(config: Config, tempDir?: string): ReaderLimits {
  return {
    maxDecompressedBytes: config.DECOMPRESSED_MAX_BYTES, maxCompressionRatio: config.DECOMPRESSION_MAX_RATIO,
    maxTempFileBytes: config.JOB_TEMP_MAX_BYTES, tempDir: tempDir ?? config.JOB_TEMP_DIR,
  };
}
