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

  /** A sum to add series' MSD ingredients into, sized for this engine. */
  newSum(): MsdSum {
    return new MsdSum(this.correlator.powerLength, this.nLags);
  }

  /**
   * Adds this series' MSD ingredients into `sum`: its power spectrum and the
   * S1 running sums. Summed over many series, `curveOf` turns them into the
   * sum of their MSDs with one inverse transform, as the transform is linear.
   */
  addTo(series: Float64Array, offset: number, sum: MsdSum): void {
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
    this.correlator.addPower(x, sum.power);
    const s1 = sum.s1;
    s1[0] += q;
    for (let m = 1; m < this.nLags; m++) {
      const a = x[m - 1], b = x[T - m];
      q -= a * a + b * b;
      s1[m] += q;
    }
  }

  /** Σ MSD(m) of the series added into `sum`, lags 0..nLags−1, into out. */
  curveOf(sum: MsdSum, out: Float64Array = new Float64Array(this.nLags)): Float64Array {
    const T = this.nFrames;
    const s2 = this.correlator.lagSumsOf(sum.power, this.lagSums);
    for (let m = 0; m < this.nLags; m++) out[m] = (sum.s1[m] - 2 * s2[m]) / (T - m);
    return out;
  }
}

/** MSD ingredients summed over series: power spectra and S1 running sums. */
export class MsdSum {
  readonly power: Float64Array;
  readonly s1: Float64Array;

  constructor(powerLength: number, nLags: number) {
    this.power = new Float64Array(powerLength);
    this.s1 = new Float64Array(nLags);
  }

  /** Adds another sum (one atom's components into its group, say). */
  add(other: MsdSum): void {
    for (let k = 0; k < this.power.length; k++) this.power[k] += other.power[k];
    for (let m = 0; m < this.s1.length; m++) this.s1[m] += other.s1[m];
  }

  clear(): void {
    this.power.fill(0);
    this.s1.fill(0);
  }
}
