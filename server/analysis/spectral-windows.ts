/**
 * Windows for spectra. A lag window multiplies a correlation function over
 * lags 0..M−1 with w(0) = 1 (keeping ∫Ĉ dν = C(0)); a data window multiplies
 * a time series before its power spectrum is taken, which keeps the spectrum
 * non-negative (SCIENCE item 25) while taming leakage from its ends.
 */
import { SPECTRAL_WINDOWS, type SpectralWindow } from '../../shared/analysis-params.ts';

export const WINDOW_FUNCTIONS = SPECTRAL_WINDOWS;
export type WindowFunction = SpectralWindow;

export function lagWindow(kind: WindowFunction, m: number, M: number): number {
  const u = m / M;
  switch (kind) {
    case 'none':
      return 1;
    case 'hann':
      return 0.5 * (1 + Math.cos(Math.PI * u));
    case 'blackman':
      return 0.42 + 0.5 * Math.cos(Math.PI * u) + 0.08 * Math.cos(2 * Math.PI * u);
    case 'gaussian':
      // σ = M/3: the window has fallen to 1 % at the last lag.
      return Math.exp(-0.5 * (3 * u) ** 2);
  }
}

/** Symmetric data window over samples 0..n−1: the lag window mirrored about the centre. */
export function dataWindow(kind: WindowFunction, n: number): Float64Array {
  const centre = (n - 1) / 2;
  return Float64Array.from({ length: n }, (_, t) => (n < 2 ? 1 : lagWindow(kind, Math.abs(t - centre), centre)));
}
