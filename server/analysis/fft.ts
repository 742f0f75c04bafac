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

  /** Writes the raw lag sums for lags 0..out.length−1 (out.length ≤ length). */
  correlate(x: ArrayLike<number>, out: Float64Array, offset = 0): Float64Array {
    const n = this.length;
    const L = this.fftLength;
    const input = this.input;
    for (let i = 0; i < n; i++) input[i] = x[offset + i];
    input.fill(0, n);
    const spec = this.spectrum;
    this.fft.realTransform(spec, input);
    const power = this.power;
    const half = L >>> 1;
    for (let k = 0; k <= half; k++) {
      const re = spec[2 * k];
      const im = spec[2 * k + 1];
      power[k] = re * re + im * im;
    }
    for (let k = 1; k < half; k++) power[L - k] = power[k];
    // The power spectrum is real and even, so a forward real transform gives
    // L times the inverse transform.
    this.fft.realTransform(spec, power);
    const m = Math.min(out.length, n);
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
