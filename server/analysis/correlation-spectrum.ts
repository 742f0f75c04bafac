/**
 * Two-sided Fourier transform of an even correlation function sampled at
 * lags 0..M−1: Ĉ(ν_k) = Δt·[c₀ + 2·Σ_{m=1}^{M−2} w_m·c_m·cos(2πkm/L) + w_{M−1}·c_{M−1}·cos(…)],
 * ν_k = k/(L·Δt). The last lag has the trapezoid half weight, so Ĉ(0) is
 * exactly twice the trapezoid integral of the windowed c; Σ_k Ĉ_k·Δν over the
 * full circle equals c₀ for any window with w₀ = 1 (discrete Parseval).
 */
import { CosineSpectrum, nextPowerOfTwo } from './fft.ts';
import { lagWindow, type WindowFunction } from './spectral-windows.ts';

export interface CorrelationSpectrum {
  fftLength: number;
  binWidth: number;
  /** Ĉ at ν_k, k = 0..L/2, in (c unit)·(time unit). */
  values: Float64Array;
}

export function correlationSpectrum(c: ArrayLike<number>, dt: number, window: WindowFunction, zeroPadFactor = 1, transformer?: CosineSpectrum): CorrelationSpectrum {
  const M = c.length;
  if (M < 2) throw new Error('A spectrum needs at least two lags.');
  const L = transformer?.fftLength ?? nextPowerOfTwo(2 * M * Math.max(1, zeroPadFactor));
  const fft = transformer ?? new CosineSpectrum(L);
  const b = new Float64Array(M);
  b[0] = c[0];
  for (let m = 1; m < M; m++) b[m] = (m === M - 1 ? 1 : 2) * lagWindow(window, m, M) * c[m];
  const values = fft.transform(b, new Float64Array(L / 2 + 1));
  for (let k = 0; k < values.length; k++) values[k] *= dt;
  return { fftLength: L, binWidth: 1 / (L * dt), values };
}
