/**
 * Standard error of the mean of a correlated series by blocking
 * (H. Flyvbjerg & H. G. Petersen, J. Chem. Phys. 91, 461 (1989)): average
 * neighbouring pairs repeatedly; the naive error of the blocked series rises
 * with the level until blocks are longer than the correlation time, then
 * stays flat within its own error. The first level from which the next two
 * levels rise by less than that error is taken as the plateau.
 */
export interface BlockLevel {
  blockSize: number;
  blocks: number;
  stdError: number;
  /** Uncertainty of stdError itself, stdError/√(2(n−1)). */
  stdErrorError: number;
}

export interface BlockAverage {
  mean: number;
  stdError: number;
  /** Naive σ/√N treating samples as independent. */
  naiveStdError: number;
  /** Statistical inefficiency g = (SE/naive SE)². */
  inefficiency: number;
  plateauLevel: number;
  converged: boolean;
  levels: BlockLevel[];
}

/** Levels stop when fewer blocks than this remain. */
const MIN_BLOCKS = 16;

export function blockAverage(series: ArrayLike<number>): BlockAverage {
  const n0 = series.length;
  if (n0 < 2) throw new Error('Block averaging needs at least two samples.');
  let data = Float64Array.from(series);
  let mean = 0;
  for (let i = 0; i < n0; i++) mean += data[i];
  mean /= n0;
  const levels: BlockLevel[] = [];
  let size = 1;
  while (data.length >= 2) {
    const n = data.length;
    let c0 = 0;
    for (let i = 0; i < n; i++) c0 += (data[i] - mean) ** 2;
    c0 /= n;
    const se = Math.sqrt(c0 / (n - 1));
    levels.push({ blockSize: size, blocks: n, stdError: se, stdErrorError: se / Math.sqrt(2 * (n - 1)) });
    if (n < 2 * MIN_BLOCKS) break;
    const half = Math.floor(n / 2);
    const next = new Float64Array(half);
    for (let i = 0; i < half; i++) next[i] = 0.5 * (data[2 * i] + data[2 * i + 1]);
    data = next;
    size *= 2;
  }
  const usable = levels.filter((l) => l.blocks >= MIN_BLOCKS);
  let plateau = -1;
  for (let k = 0; k + 2 < usable.length; k++) {
    const l = usable[k];
    if (usable[k + 1].stdError <= l.stdError + l.stdErrorError && usable[k + 2].stdError <= l.stdError + l.stdErrorError) {
      plateau = k;
      break;
    }
  }
  const converged = plateau >= 0;
  if (!converged) {
    plateau = usable.length > 0 ? usable.reduce((best, l, k) => (l.stdError > usable[best].stdError ? k : best), 0) : 0;
  }
  const chosen = (usable.length > 0 ? usable : levels)[plateau];
  const naive = levels[0].stdError;
  return {
    mean,
    stdError: chosen.stdError,
    naiveStdError: naive,
    inefficiency: naive > 0 ? (chosen.stdError / naive) ** 2 : 1,
    plateauLevel: plateau,
    converged,
    levels,
  };
}
