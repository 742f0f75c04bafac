/**
 * The engine's only door to the FFT library. Correlations are computed by the
 * Wiener–Khinchin theorem with zero padding to a power of two ≥ 2N, so the
 * circular correlation the FFT computes equals the linear one (Futrelle &
 * McGinty, Chem. Phys. Lett. 12, 1971). Buffers are allocated once per length
 * and reused across atoms.
 */
import FFT from 'fft.js';

export function nextPowerOfTwo(n: number): number {
  let p = 2;
  while (p < n) p *= 2;
  return p;
}

/**
 * Raw autocorrelation sums A[m] = Σ_{k=0}^{n−1−m} x_k·x_{k+m} for m < n.
 * `zeroPad: false` is only for demonstrating the cyclic wrap-around error and
 * needs n to be a power of two.
 */
export class Autocorrelator {
  readonly length: number;
  readonly fftLength: number;
  private readonly fft: FFT;
  private readonly input: Float64Array;
  private readonly spectrum: Float64Array;
  private readonly power: Float64Array;

  constructor(length: number, options: { zeroPad?: boolean } = {}) {
    if (!Number.isInteger(length) || length < 1) throw new Error('Correlation length must be a positive integer.');
    this.length = length;
    const zeroPad = options.zeroPad ?? true;
    if (!zeroPad && (length < 2 || (length & (length - 1)) !== 0)) {
      throw new Error('Without zero padding the length must be a power of two ≥ 2.');
    }
    this.fftLength = zeroPad ? nextPowerOfTwo(2 * length) : length;
    this.fft = new FFT(this.fftLength);
    this.input = new Float64Array(this.fftLength);
    this.spectrum = new Float64Array(2 * this.fftLength);
    this.power = new Float64Array(this.fftLength);
  }

  /** Length of the one-sided power spectra `addPower` fills and `lagSumsOf` reads: L/2 + 1. */
  get powerLength(): number {
    return (this.fftLength >>> 1) + 1;
  }

  /** Writes the raw lag sums for lags 0..out.length−1 (out.length ≤ length). */
  correlate(x: ArrayLike<number>, out: Float64Array, offset = 0): Float64Array {
    const power = this.power;
    power.fill(0, 0, this.powerLength);
    this.addPower(x, power, offset);
    return this.lagSumsOf(power, out);
  }

  /**
   * Adds weight·|X_k|² (k = 0..L/2) of x[offset, offset + length), zero
   * padded, into `into`. The transform is linear, so the lag sums of many
   * series add up to `lagSumsOf` their summed powers: one inverse transform
   * for a whole group instead of one per series.
   */
  addPower(x: ArrayLike<number>, into: Float64Array, offset = 0, weight = 1): void {
    const n = this.length;
    const input = this.input;
    for (let i = 0; i < n; i++) input[i] = x[offset + i];
    input.fill(0, n);
    const spec = this.spectrum;
    this.fft.realTransform(spec, input);
    const half = this.fftLength >>> 1;
    if (weight === 1) {
      for (let k = 0; k <= half; k++) into[k] += spec[2 * k] * spec[2 * k] + spec[2 * k + 1] * spec[2 * k + 1];
    } else {
      for (let k = 0; k <= half; k++) into[k] += weight * (spec[2 * k] * spec[2 * k] + spec[2 * k + 1] * spec[2 * k + 1]);
    }
  }

  /** The raw lag sums for lags 0..out.length−1 of the series whose powers were added into `power` (length L/2 + 1). */
  lagSumsOf(power: Float64Array, out: Float64Array): Float64Array {
    const L = this.fftLength;
    const half = L >>> 1;
    const full = this.power;
    if (full !== power) full.set(power.subarray(0, half + 1));
    for (let k = 1; k < half; k++) full[L - k] = full[k];
    // The power spectrum is real and even, so a forward real transform gives
    // L times the inverse transform.
    const spec = this.spectrum;
    this.fft.realTransform(spec, full);
    const m = Math.min(out.length, this.length);
    const scale = 1 / L;
    for (let i = 0; i < m; i++) out[i] = spec[2 * i] * scale;
    return out;
  }
}

/**
 * |X_k|² of a real sequence zero-padded to L (power of two), k = 0..L/2,
 * where X_k = Σ_t x_t·e^{−2πikt/L}.
 */
export class PowerSpectrum {
  readonly fftLength: number;
  private readonly fft: FFT;
  private readonly input: Float64Array;
  private readonly spectrum: Float64Array;

  constructor(fftLength: number) {
    if (fftLength < 2 || (fftLength & (fftLength - 1)) !== 0) throw new Error('FFT length must be a power of two ≥ 2.');
    this.fftLength = fftLength;
    this.fft = new FFT(fftLength);
    this.input = new Float64Array(fftLength);
    this.spectrum = new Float64Array(2 * fftLength);
  }

  /** The input buffer to fill (its tail beyond the data must be zero; `transform` leaves it as filled). */
  get buffer(): Float64Array {
    return this.input;
  }

  /** Adds weight·|X_k|² of the current buffer into out[0..L/2]. */
  addPower(out: Float64Array, weight: number): void {
    this.fft.realTransform(this.spectrum, this.input);
    const s = this.spectrum;
    const half = this.fftLength >>> 1;
    for (let k = 0; k <= half; k++) out[k] += weight * (s[2 * k] * s[2 * k] + s[2 * k + 1] * s[2 * k + 1]);
  }
}
