/**
 * Static structure factor from g(r):
 *   S(q) = 1 + 4πρ ∫₀^{r_max} r²·[g(r) − 1]·(sin qr)/(qr)·W(r) dr,
 * with the Lorch window W(r) = sin(πr/r_max)/(πr/r_max) by default
 * (E. Lorch, J. Phys. C 2, 229 (1969) [from memory]) to damp the ripples the
 * finite r_max would otherwise put into S(q). The integral is a midpoint sum
 * over the g(r) bins. Below q ≈ 2π/r_max the result reflects the window
 * more than the sample.
 */
import { rdf, type RdfOptions, type RdfResult } from './rdf.ts';
import type { Trajectory } from './trajectory.ts';

export { SQ_WINDOWS, type SqWindow } from '../../shared/analysis-params.ts';
import type { SqWindow } from '../../shared/analysis-params.ts';

export interface SqOptions extends RdfOptions {
  qMaxInvA?: number;
  dqInvA?: number;
  sqWindow?: SqWindow;
}

export interface SqResult {
  units: { q: 'Å⁻¹'; s: '1' };
  qInvA: Float64Array;
  s: Float64Array;
  window: SqWindow;
  /** Below this q the transform is dominated by the finite r_max. */
  qReliableFromInvA: number;
}

export function sq(traj: Trajectory, options: SqOptions = {}, onProgress?: (fraction: number) => void): SqResult {
  return sqFromRdf(rdf(traj, options, onProgress), options);
}

export function sqFromRdf(r: RdfResult, options: SqOptions = {}): SqResult {
  return structureFactor(r.rA, r.total.g, r.binWidthA, r.numberDensityPerA3, options);
}

export function structureFactor(rA: ArrayLike<number>, g: ArrayLike<number>, binWidthA: number, numberDensity: number, options: Omit<SqOptions, keyof RdfOptions> = {}): SqResult {
  const window = options.sqWindow ?? 'lorch';
  const rMax = rA[rA.length - 1] + binWidthA / 2;
  const dq = options.dqInvA ?? 0.02;
  const qMax = options.qMaxInvA ?? Math.min(20, Math.PI / binWidthA);
  const nq = Math.max(1, Math.floor(qMax / dq));
  const qInvA = Float64Array.from({ length: nq }, (_, i) => (i + 1) * dq);
  const weight = new Float64Array(rA.length);
  for (let k = 0; k < rA.length; k++) {
    const r = rA[k];
    const u = (Math.PI * r) / rMax;
    const w = window === 'lorch' ? Math.sin(u) / u : 1;
    weight[k] = 4 * Math.PI * numberDensity * r * (g[k] - 1) * w * binWidthA;
  }
  const s = new Float64Array(nq);
  for (let i = 0; i < nq; i++) {
    const q = qInvA[i];
    let acc = 0;
    for (let k = 0; k < rA.length; k++) acc += weight[k] * Math.sin(q * rA[k]);
    s[i] = 1 + acc / q;
  }
  return { units: { q: 'Å⁻¹', s: '1' }, qInvA, s, window, qReliableFromInvA: (2 * Math.PI) / rMax };
}
