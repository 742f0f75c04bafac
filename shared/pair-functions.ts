/**
 * Values of a resolved pair potential: U(r) and dU/dr in eV and eV/Å, the
 * energy shift a "shifted" pair subtracts, and the tail integral
 * ∫_rc^∞ r²U(r) dr that analytic tail corrections need. Used by the engine
 * and by the browser's U(r) plot, so both draw on the same definitions.
 */
import { CubicSpline } from './cubic-spline.ts';
import type { ResolvedPair } from './interaction-model.ts';

/** Writes U(r) (unshifted) into out[0] and dU/dr into out[1]. */
export type PairEvaluator = (r: number, out: Float64Array) => void;

export function pairEvaluator(p: ResolvedPair): PairEvaluator {
  switch (p.form) {
    case 'lj': {
      const e4 = 4 * p.epsilonEV, s = p.sigmaA;
      return (r, out) => {
        const s6 = (s / r) ** 6;
        out[0] = e4 * (s6 * s6 - s6);
        out[1] = (e4 * (-12 * s6 * s6 + 6 * s6)) / r;
      };
    }
    case 'morse': {
      const { depthEV: D, alphaPerA: a, r0A: r0 } = p;
      return (r, out) => {
        const e = Math.exp(-a * (r - r0));
        out[0] = D * (e * e - 2 * e);
        out[1] = 2 * a * D * (e - e * e);
      };
    }
    case 'buckingham': {
      const { aEV: A, rhoA: rho, cEVA6: C } = p;
      return (r, out) => {
        const ex = A * Math.exp(-r / rho), r6 = r ** 6;
        out[0] = ex - C / r6;
        out[1] = -ex / rho + (6 * C) / (r6 * r);
      };
    }
    case 'table': {
      const spline = new CubicSpline(p.rA, p.uEV);
      return (r, out) => spline.evaluate(r, out);
    }
    case 'none':
      return (_r, out) => {
        out[0] = 0;
        out[1] = 0;
      };
  }
}

/** U(rc), the constant a shifted or force-shifted pair subtracts inside its cut-off (0 when truncated). */
export function shiftOf(p: ResolvedPair): number {
  if (p.truncation === 'truncated' || p.form === 'none') return 0;
  const out = new Float64Array(2);
  pairEvaluator(p)(p.cutoffA, out);
  return out[0];
}

/** U′(rc), the force a force-shifted pair subtracts (0 otherwise): U_fs(r) = U(r) − U(rc) − (r − rc)·U′(rc). */
export function forceShiftOf(p: ResolvedPair): number {
  if (p.truncation !== 'force-shifted' || p.form === 'none') return 0;
  const out = new Float64Array(2);
  pairEvaluator(p)(p.cutoffA, out);
  return out[1];
}

/**
 * ∫_rc^∞ r²·U(r) dr in eV·Å³, closed forms for the analytic pair forms:
 *   LJ          4εσ³[(σ/rc)⁹/9 − (σ/rc)³/3]
 *   Morse       D[e^{−2α(rc−r₀)}·q(2α) − 2e^{−α(rc−r₀)}·q(α)], q(k) = rc²/k + 2rc/k² + 2/k³
 *   Buckingham  A·ρ·e^{−rc/ρ}(rc² + 2ρrc + 2ρ²) − C/(3rc³)
 * Tables and "none" have no tail (zero beyond the cut-off).
 */
export function tailIntegral(p: ResolvedPair): number {
  const rc = p.cutoffA;
  switch (p.form) {
    case 'lj': {
      const x3 = (p.sigmaA / rc) ** 3;
      return 4 * p.epsilonEV * p.sigmaA ** 3 * ((x3 * x3 * x3) / 9 - x3 / 3);
    }
    case 'morse': {
      const q = (k: number): number => (rc * rc) / k + (2 * rc) / (k * k) + 2 / (k * k * k);
      const a = p.alphaPerA, e = Math.exp(-a * (rc - p.r0A));
      return p.depthEV * (e * e * q(2 * a) - 2 * e * q(a));
    }
    case 'buckingham': {
      const rho = p.rhoA;
      return p.aEV * rho * Math.exp(-rc / rho) * (rc * rc + 2 * rho * rc + 2 * rho * rho) - p.cEVA6 / (3 * rc ** 3);
    }
    default:
      return 0;
  }
}

/** U(r) on a grid for plotting: [r, U − shift] up to the cut-off, starting where U falls below `ceilingEV`. */
export function pairCurve(p: ResolvedPair, points = 200, ceilingEV?: number): { rA: number[]; uEV: number[] } {
  const evaluate = pairEvaluator(p);
  const shift = shiftOf(p), slope = forceShiftOf(p);
  const out = new Float64Array(2);
  const rc = p.form === 'none' ? 10 : p.cutoffA;
  const start = p.form === 'table' ? p.rA[0] : Math.max(0.05 * rc, 0.5);
  const rA: number[] = [], uEV: number[] = [];
  for (let k = 0; k <= points; k++) {
    const r = start + ((rc - start) * k) / points;
    evaluate(r, out);
    const u = out[0] - shift - (r - rc) * slope;
    if (ceilingEV !== undefined && u > ceilingEV && rA.length === 0) continue;
    rA.push(r);
    uEV.push(u);
  }
  return { rA, uEV };
}
