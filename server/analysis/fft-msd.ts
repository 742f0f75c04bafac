/**
 * MSD of one coordinate series over all time origins in O(T log T):
 * MSD(m) = S1(m) − 2·S2(m), S2 the autocorrelation by FFT and S1 from the
 * running-sum recursion (Kneller et al., Comput. Phys. Commun. 91, 191
 * (1995) [from memory]; the identity is elementary algebra). The series is
 * centred first so large absolute coordinates do not cancel catastrophically.
 */
import { Autocorrelator } from './fft.ts';

export class FftMsd {
  private readonly correlator: Autocorrelator;
  private readonly centred: Float64Array;
  private readonly lagSums: Float64Array;

  constructor(readonly nFrames: number, readonly nLags: number, options: { zeroPad?: boolean } = {}) {
    if (nLags > nFrames) throw new Error('More lags than frames.');
    this.correlator = new Autocorrelator(nFrames, options);
    this.centred = new Float64Array(nFrames);
    this.lagSums = new Float64Array(nLags);
  }

  /** Adds this series' MSD (lags 0..nLags−1) into out. */
  accumulate(series: Float64Array, offset: number, out: Float64Array, scale = 1): void {
    const T = this.nFrames;
    const x = this.centred;
    let mean = 0;
    for (let t = 0; t < T; t++) mean += series[offset + t];
    mean /= T;
    let q = 0;
    for (let t = 0; t < T; t++) {
      const v = series[offset + t] - mean;
      x[t] = v;
      q += v * v;
    }
    q *= 2;
    const s2 = this.correlator.correlate(x, this.lagSums);
    out[0] += scale * (q / T - (2 * s2[0]) / T);
    for (let m = 1; m < this.nLags; m++) {
      const a = x[m - 1], b = x[T - m];
      q -= a * a + b * b;
      out[m] += (scale * (q - 2 * s2[m])) / (T - m);
    }
  }
}
