import type { Config } from '../config.ts';
import type { ReaderLimits } from '../formats/limits.ts';

/** The site's configured bounds for reading uploads. */
export function readerLimits(config: Config): ReaderLimits {
  return { maxDecompressedBytes: config.DECOMPRESSED_MAX_BYTES, maxCompressionRatio: config.DECOMPRESSION_MAX_RATIO };
}
