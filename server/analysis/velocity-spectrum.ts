/**
 * Power spectrum of velocity series, one component series at a time
 * (SCIENCE item 25): P(ν_k) = Δt·|Σ_t w_t·v_t·e^{−2πikt/L}|² / Σ_t w_t², a
 * two-sided spectral density that is ≥ 0 at every frequency by construction
 * and, by the discrete Parseval identity, integrates over the full circle to
 * the window-weighted mean of v². Long series are cut into half-overlapping
 * segments whose periodograms are averaged (Welch's method, P. D. Welch,
 * IEEE Trans. Audio Electroacoust. 15, 70 (1967) [from memory]): the
 * segment length sets the resolution, the number of segments the smoothness.
 */
import { nextPowerOfTwo, PowerSpectrum } from './fft.ts';
import { dataWindow, type WindowFunction } from './spectral-windows.ts';

export interface SegmentPlan {
  /** Samples in the velocity series. */
  seriesLength: number;
  /** Samples per segment. */
  segment: number;
  /** First sample of each segment (half overlap). */
  starts: number[];
  /** Transform length (power of two ≥ segment·zero padding). */
  fftLength: number;
}

export function planSegments(seriesLength: number, maxSegment: number, zeroPadFactor = 1): SegmentPlan {
  if (seriesLength < 2) throw new Error('A velocity spectrum needs at least two velocity frames.');
  const segment = Math.max(2, Math.min(seriesLength, Math.floor(maxSegment)));
  const hop = Math.max(1, Math.floor(segment / 2));
  const starts: number[] = [];
  for (let s = 0; s + segment <= seriesLength; s += hop) starts.push(s);
  return { seriesLength, segment, starts, fftLength: nextPowerOfTwo(segment * Math.max(1, zeroPadFactor)) };
}

/** Sums a series contributes, for the Parseval normalisation. */
export interface SeriesMoments {
  /** Mean of v² over every sample. */
  meanSquare: number;
  /** Window-weighted mean of v², averaged over segments (what the spectrum integrates to). */
  windowedMeanSquare: number;
}

export class VelocityPowerSpectrum {
  readonly nFreq: number;
  readonly binWidth: number;
  private readonly power: PowerSpectrum;
  private readonly window: Float64Array;
  private readonly windowSquareSum: number;

  constructor(readonly plan: SegmentPlan, readonly windowKind: WindowFunction, readonly dt: number) {
    this.power = new PowerSpectrum(plan.fftLength);
    this.nFreq = plan.fftLength / 2 + 1;
    this.binWidth = 1 / (plan.fftLength * dt);
    this.window = dataWindow(windowKind, plan.segment);
    let s = 0;
    for (const w of this.window) s += w * w;
    this.windowSquareSum = s;
  }

  /** Frequencies of the one-sided grid, in 1/(time unit of dt). */
  frequencies(): Float64Array {
    return Float64Array.from({ length: this.nFreq }, (_, k) => k * this.binWidth);
  }

  /**
   * Adds the segment-averaged periodogram of series[offset .. offset+seriesLength)
   * into out (length nFreq) and returns its moments.
   */
  add(series: ArrayLike<number>, offset: number, out: Float64Array): SeriesMoments {
    const { segment, starts, seriesLength } = this.plan;
    const buffer = this.power.buffer;
    const w = this.window;
    const weight = this.dt / (this.windowSquareSum * starts.length);
    let windowed = 0;
    for (const start of starts) {
      for (let t = 0; t < segment; t++) {
        const x = w[t] * series[offset + start + t];
        buffer[t] = x;
        windowed += x * x;
      }
      buffer.fill(0, segment);
      this.power.addPower(out, weight);
    }
    let plain = 0;
    for (let t = 0; t < seriesLength; t++) plain += series[offset + t] ** 2;
    return { meanSquare: plain / seriesLength, windowedMeanSquare: windowed / (this.windowSquareSum * starts.length) };
  }
}

/**
 * Amplitude transfer function of the central difference [x(t+Δt) − x(t−Δt)]/(2Δt):
 * for x = A·cos ωt it returns v·sin(ωΔt)/(ωΔt) (SCIENCE item 24 [DERIVED]).
 */
export function centralDifferenceGain(frequency: number, dt: number): number {
  const x = 2 * Math.PI * frequency * dt;
  return x === 0 ? 1 : Math.sin(x) / x;
}

/**
 * Highest ωΔt at which a central-difference spectrum is divided by its gain²:
 * at 3π/4 the gain is 0.30 (×11 in power); towards π it vanishes and nothing
 * can be restored (SCIENCE item 24).
 */
export const CORRECTABLE_OMEGA_DT = 0.75 * Math.PI;

export interface DifferenceCorrection {
  /** Frequencies up to this were divided by the gain², THz. */
  correctedUpToThz: number;
  /** ∫ corrected spectrum / ∫ raw spectrum (one-sided). */
  correctedOverRaw: number;
  /** Share of the raw spectrum's weight above the correctable range. */
  uncorrectableFraction: number;
  /** Where the raw spectrum is highest above the correctable range, THz (null if it is empty there). */
  strongestUncorrectableThz: number | null;
}

/** Divides a one-sided central-difference power spectrum by sinc²(ωΔt) where that can be done, in place. */
export function correctCentralDifferences(freq: ArrayLike<number>, power: Float64Array, dt: number): DifferenceCorrection {
  const limit = CORRECTABLE_OMEGA_DT / (2 * Math.PI * dt);
  let raw = 0, corrected = 0, beyond = 0, strongest = -1;
  for (let k = 0; k < power.length; k++) {
    const w = k === 0 || k === power.length - 1 ? 0.5 : 1;
    raw += w * power[k];
    if (freq[k] <= limit) power[k] /= centralDifferenceGain(freq[k], dt) ** 2;
    else {
      beyond += w * power[k];
      if (strongest < 0 || power[k] > power[strongest]) strongest = k;
    }
    corrected += w * power[k];
  }
  return {
    correctedUpToThz: limit,
    correctedOverRaw: raw > 0 ? corrected / raw : 1,
    uncorrectableFraction: raw > 0 ? beyond / raw : 0,
    strongestUncorrectableThz: strongest >= 0 && power[strongest] > 0 ? freq[strongest] : null,
  };
}
