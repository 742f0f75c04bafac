/**
 * Arrhenius fit across runs, D(T) = D0·exp(−Ea/(R·T)): least squares of
 * ln D on 1/T, weighted by (D/σ_D)² when run errors are given. Errors are
 * the fit's parameter standard errors.
 */
import { GAS_CONSTANT_J_PER_MOL_K } from './constants.ts';
import { energyFromJPerMol } from './units.ts';

export interface ArrheniusInput {
  temperatureK: readonly number[];
  /** D in any one unit; D0 comes back in the same unit. */
  d: readonly number[];
  dStdError?: readonly number[];
}

export interface ArrheniusResult {
  activationEnergy: { jPerMol: number; kJPerMol: number; eV: number };
  activationEnergyStdError: { jPerMol: number; kJPerMol: number; eV: number };
  d0: number;
  d0StdError: number;
  points: number;
}

export function arrhenius(input: ArrheniusInput): ArrheniusResult {
  const n = input.temperatureK.length;
  if (n < 2 || input.d.length !== n) throw new Error('An Arrhenius fit needs at least two (T, D) pairs of equal count.');
  const x: number[] = [], y: number[] = [], w: number[] = [];
  for (let i = 0; i < n; i++) {
    const t = input.temperatureK[i], d = input.d[i];
    if (!(t > 0) || !(d > 0)) throw new Error('Temperatures and diffusion coefficients must be positive.');
    x.push(1 / t);
    y.push(Math.log(d));
    const s = input.dStdError?.[i];
    w.push(s && s > 0 ? (d / s) ** 2 : 1);
  }
  let sw = 0, sx = 0, sy = 0;
  for (let i = 0; i < n; i++) (sw += w[i]), (sx += w[i] * x[i]), (sy += w[i] * y[i]);
  const mx = sx / sw, my = sy / sw;
  let sxx = 0, sxy = 0;
  for (let i = 0; i < n; i++) (sxx += w[i] * (x[i] - mx) ** 2), (sxy += w[i] * (x[i] - mx) * (y[i] - my));
  const slope = sxy / sxx;
  const intercept = my - slope * mx;
  let rss = 0;
  for (let i = 0; i < n; i++) rss += w[i] * (y[i] - intercept - slope * x[i]) ** 2;
  // With given errors the weights are absolute; otherwise scale by the residual variance.
  const scale = input.dStdError ? 1 : n > 2 ? rss / (n - 2) : NaN;
  const slopeVar = scale / sxx;
  const interceptVar = scale * (1 / sw + (mx * mx) / sxx);
  const ea = -slope * GAS_CONSTANT_J_PER_MOL_K;
  const d0 = Math.exp(intercept);
  return {
    activationEnergy: energyFromJPerMol(ea),
    activationEnergyStdError: energyFromJPerMol(Math.sqrt(slopeVar) * GAS_CONSTANT_J_PER_MOL_K),
    d0,
    d0StdError: d0 * Math.sqrt(interceptVar),
    points: n,
  };
}
