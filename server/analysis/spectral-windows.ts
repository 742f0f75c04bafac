/**
 * Lag windows applied to a correlation function before its transform. Each
 * is one-sided over lags 0..M−1 with w(0) = 1, which keeps the spectrum's
 * integral (Parseval: ∫Ĉ dν = C(0)) while taming truncation ripples.
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
