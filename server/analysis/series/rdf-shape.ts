/**
 * Reads the shape of a member's g(r) for its phase: the first-shell
 * minimum-to-peak ratio (crystal < liquid < gas) and the packing n·r₁³ of
 * the most abundant species, read from the report's own g(r) curve and
 * headline so nothing is recomputed from frames.
 */
import type { RdfPairSummary } from '../../../shared/report-summary.ts';
import type { RdfShape } from '../../../shared/series-results.ts';

export interface RdfCurveInput {
  columns: readonly string[];
  data: readonly ArrayLike<number | null>[];
}

/** Below this first-peak height g(r) has no shell worth measuring a packing from. */
const MIN_PEAK_FOR_PACKING = 1.3;
/**
 * A first "peak" closer than this, or lower than MIN_SHELL_PEAK, is noise in
 * the few pairs at small r (no bond is shorter than ~0.7 Å), not a shell.
 */
const MIN_SHELL_RADIUS_A = 0.5;
const MIN_SHELL_PEAK = 1.2;

/** The like pair of the most abundant species, or "all" for one species or when that pair is missing. */
export function shapePair(pairs: readonly RdfPairSummary[], speciesCounts: Readonly<Record<string, number>> | null): string {
  const species = Object.entries(speciesCounts ?? {}).sort((a, b) => b[1] - a[1]);
  if (species.length > 1) {
    const like = `${species[0][0]}-${species[0][0]}`;
    if (pairs.some((p) => p.label === like && p.firstPeak)) return like;
  }
  return 'all';
}

export function rdfShape(curve: RdfCurveInput | null, pairs: readonly RdfPairSummary[], speciesCounts: Readonly<Record<string, number>> | null): RdfShape | null {
  const pair = shapePair(pairs, speciesCounts);
  const summary = pairs.find((p) => p.label === pair);
  if (!summary?.firstPeak) return null;
  const r = curve ? column(curve, 'r') : null;
  const g = curve ? column(curve, `g ${pair}`) : null;
  const n = curve ? column(curve, `N ${pair}`) : null;

  let firstMinimum: RdfShape['firstMinimum'] = null;
  if (summary.firstMinimum) {
    const gMin = r && g ? valueAt(r, g, summary.firstMinimum.rA) : null;
    if (gMin !== null) firstMinimum = { rA: summary.firstMinimum.rA, g: gMin, coordination: summary.firstMinimum.coordination };
  }
  const peak = summary.firstPeak;
  if (peak.rA < MIN_SHELL_RADIUS_A || peak.g < MIN_SHELL_PEAK) {
    return { firstPeak: { rA: peak.rA, g: peak.g }, firstMinimum: null, minToPeakRatio: null, packing: null, pair, shells: false };
  }
  const minToPeakRatio = firstMinimum && peak.g > 0 ? firstMinimum.g / peak.g : null;

  let packing: number | null = null;
  if (r && n && peak.g >= MIN_PEAK_FOR_PACKING) {
    // N(r) = 4πn∫g r'² dr' → n·(4/3)πr³ once g(r) ≈ 1; the last bin is the farthest from the shells.
    const last = lastFinite(r, n);
    if (last !== null && last.r > 2 * peak.rA) {
      const density = last.n / ((4 / 3) * Math.PI * last.r ** 3);
      packing = density * peak.rA ** 3;
    }
  }
  return { firstPeak: { rA: peak.rA, g: peak.g }, firstMinimum, minToPeakRatio, packing, pair, shells: true };
}

function column(curve: RdfCurveInput, name: string): ArrayLike<number | null> | null {
  const i = curve.columns.indexOf(name);
  return i >= 0 ? (curve.data[i] ?? null) : null;
}

/** g at the bin nearest to rA. */
function valueAt(r: ArrayLike<number | null>, g: ArrayLike<number | null>, rA: number): number | null {
  let best = -1, bestDistance = Infinity;
  for (let i = 0; i < r.length; i++) {
    const ri = r[i];
    if (ri === null) continue;
    const distance = Math.abs(ri - rA);
    if (distance < bestDistance) (best = i), (bestDistance = distance);
  }
  const value = best >= 0 ? g[best] : null;
  return value === null || value === undefined || !Number.isFinite(value) ? null : value;
}

function lastFinite(r: ArrayLike<number | null>, n: ArrayLike<number | null>): { r: number; n: number } | null {
  for (let i = Math.min(r.length, n.length) - 1; i >= 0; i--) {
    const ri = r[i], ni = n[i];
    if (ri !== null && ni !== null && Number.isFinite(ri) && Number.isFinite(ni) && ri > 0) return { r: ri, n: ni };
  }
  return null;
}
