/**
 * Statistical errors from independent blocks (SCIENCE item 30): a quantity
 * is estimated separately on B independent parts of the data — groups of
 * atoms, or consecutive stretches of time origins — and its standard error is
 * the spread of those estimates over √B. Unlike the spread of a running
 * integral over its plateau, this covers the truth as often as it claims
 * (about 95 % within ±2σ for B large; t-distributed with B − 1 degrees of
 * freedom, so about 91 % at B = 8 and 94 % at B = 16).
 */

/** Fewer blocks than this give no error rather than an unreliable one. */
export const MIN_BLOCKS = 5;
/** More blocks add little once the error of the error is ~20 %. */
export const MAX_BLOCKS = 16;

/**
 * Block index per member of a group of n (atoms in file order): contiguous
 * chunks, so atoms of one molecule, usually neighbours in a file, share a
 * block and blocks stay independent. Null when n < MIN_BLOCKS.
 */
export function atomBlockIndex(n: number): { blocks: number; of: (k: number) => number } | null {
  if (n < MIN_BLOCKS) return null;
  const blocks = Math.min(MAX_BLOCKS, n);
  return { blocks, of: (k) => Math.min(blocks - 1, Math.floor((k * blocks) / n)) };
}

/** Standard error of the mean of independent block estimates; NaN with fewer than two. */
export function blockStandardError(values: readonly number[]): number {
  const n = values.length;
  if (n < 2) return NaN;
  const mean = values.reduce((s, v) => s + v, 0) / n;
  const variance = values.reduce((s, v) => s + (v - mean) ** 2, 0) / (n - 1);
  return Math.sqrt(variance / n);
}

/**
 * Blocks for a group too small for atom blocks: each of its `members` atoms
 * cut into k consecutive stretches of the run, every (atom, stretch) pair a
 * block. Each stretch is at least twice `longestLag` frames, so a lag window
 * ending there still has half the stretch as time origins. Chooses the most
 * stretches up to MAX_BLOCKS blocks; null when fewer than MIN_BLOCKS fit.
 */
export function timeSegments(nFrames: number, longestLag: number, members: number): { segments: number; length: number; blocks: number } | null {
  const most = Math.max(1, Math.floor(MAX_BLOCKS / Math.max(1, members)));
  for (let k = most; k >= 1; k--) {
    const length = Math.floor(nFrames / k);
    if (members * k >= MIN_BLOCKS && length >= 2 * longestLag && length > longestLag + 2) return { segments: k, length, blocks: members * k };
  }
  return null;
}
