/**
 * Bounds every reader enforces, so a hostile or broken upload is refused
 * before it can exhaust memory or disk. All are options because a site
 * with bigger machines may want larger trajectories.
 */
export interface ReaderLimits {
  /** Most atoms a frame may claim (checked before anything is allocated). */
  maxAtoms?: number;
  /** Most bytes a compressed upload may expand to. */
  maxDecompressedBytes?: number;
  /** Most output bytes per input byte a compressed upload may expand by. */
  maxCompressionRatio?: number;
  /** Longest text line accepted; a longer one means binary data or a corrupt file. */
  maxLineBytes?: number;
  /**
   * Most bytes one temporary copy may take on disk: H5MD (HDF5 needs random
   * access) that arrives as a stream or inside gzip/zip is copied to a temp
   * file first. Counted with the decompressed size, so both limits hold.
   */
  maxTempFileBytes?: number;
  /** Where H5MD data that arrives as a stream is spooled (defaults to the OS temp dir). */
  tempDir?: string;
}

export type ResolvedLimits = Required<Omit<ReaderLimits, 'tempDir'>> & { tempDir?: string };

export const DEFAULT_LIMITS: ResolvedLimits = {
  maxAtoms: 50_000_000,
  maxDecompressedBytes: 64 * 1024 ** 3,
  maxCompressionRatio: 1000,
  maxLineBytes: 4 * 1024 ** 2,
  maxTempFileBytes: 4 * 1024 ** 3,
};

export function resolveLimits(limits: ReaderLimits = {}): ResolvedLimits {
  const out: ResolvedLimits = { ...DEFAULT_LIMITS };
  for (const key of ['maxAtoms', 'maxDecompressedBytes', 'maxCompressionRatio', 'maxLineBytes', 'maxTempFileBytes'] as const) {
    const value = limits[key];
    if (value !== undefined) {
      if (!(value > 0)) throw new RangeError(`${key} must be a positive number, got ${value}`);
      out[key] = value;
    }
  }
  if (limits.tempDir !== undefined) out.tempDir = limits.tempDir;
  return out;
}

/**
 * The shortest atom line any text format can have ("X 0 0 0\n"): a header
 * claiming more atoms than the remaining bytes could hold at this density
 * is refused without reading further.
 */
export const MIN_ATOM_LINE_BYTES = 8;
