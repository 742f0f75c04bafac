/**
 * Vibrational density of states from the mass-weighted VACF,
 * S(ν) = (2/k_BT)·Σ_j m_j·∫ C_j(t)·e^{−2πiνt} dt (two-sided transform), so that
 * ∫₀^∞ S dν = degrees of freedom and S(0) = 12·m·N·D/(k_BT) in 3-D
 * (Lin, Blanco & Goddard, J. Chem. Phys. 119, 11792 (2003)).
 *
 * T defaults to the kinetic temperature of the same velocities with the same
 * degrees of freedom, which makes ∫S = N_dof exactly. The last lag gets the
 * trapezoid half weight so S(0)/2 reproduces the Green–Kubo integral.
 */
import { BOLTZMANN_ENGINE, MEV_PER_THZ, WAVENUMBER_PER_THZ } from './constants.ts';
import { CosineSpectrum, nextPowerOfTwo } from './fft.ts';
import { harmonicThermo, type HarmonicThermo } from './harmonic-thermo.ts';
import { findPeaks } from './peaks.ts';
import { correlationSpectrum } from './correlation-spectrum.ts';
import type { WindowFunction } from './spectral-windows.ts';
import type { Trajectory } from './trajectory.ts';
import { vacf, type VacfOptions, type VacfResult } from './vacf.ts';

export interface VdosOptions extends VacfOptions {
  window?: WindowFunction;
  /** Transform length is the next power of two ≥ 2·lags·zeroPadFactor. */
  zeroPadFactor?: number;
  /** Degrees of freedom of the whole selection; default d·N − d when COM drift is removed. */
  degreesOfFreedom?: number;
  /** Temperature in S's normalisation; default the kinetic temperature. */
  normalisationTemperatureK?: number;
  /** Temperature for heat capacity, entropy and zero-point energy (default the kinetic one). */
  thermoTemperatureK?: number;
}

export interface VdosPeak {
  thz: number;
  cm1: number;
  meV: number;
  fwhmThz: number;
  fwhmCm1: number;
  height: number;
}

export interface VdosGroupResult {
  label: string;
  nAtoms: number;
  degreesOfFreedom: number;
  /** S(ν) in modes per THz. */
  dosPerThz: Float64Array;
  integral: number;
  kineticTemperatureK: number;
  peaks: VdosPeak[];
  /** S(0)·k_BT/(4·d·Σm) — the D implied by the zero-frequency value, Å²/ps. */
  zeroFrequencyDA2PerPs: number;
}

export interface VdosResult {
  units: { frequency: 'THz'; dos: 'modes/THz' };
  freqTHz: Float64Array;
  freqCm1: Float64Array;
  freqMeV: Float64Array;
  binWidthThz: number;
  window: WindowFunction;
  fftLength: number;
  velocitySource: VacfResult['velocitySource'];
  groups: VdosGroupResult[];
  /** Harmonic thermodynamics of the "all" group. */
  thermo: HarmonicThermo;
  thermoNote: string;
}

export function vdos(traj: Trajectory, options: VdosOptions = {}, onProgress?: (fraction: number) => void): VdosResult {
  return vdosFromVacf(vacf(traj, options, onProgress), traj, options);
}

export function vdosFromVacf(v: VacfResult, traj: Trajectory, options: VdosOptions = {}): VdosResult {
  const kind = options.window ?? 'hann';
  const M = v.lagPs.length;
  if (M < 2) throw new Error('The VDOS needs at least two lags.');
  const L = nextPowerOfTwo(2 * M * Math.max(1, options.zeroPadFactor ?? 1));
  const dt = v.dtPs;
  const transformer = new CosineSpectrum(L);
  const nFreq = L / 2 + 1;
  const freqTHz = Float64Array.from({ length: nFreq }, (_, k) => k / (L * dt));

  const groups = v.groups.map((g): VdosGroupResult => {
    const W = g.massWeightedSum;
    const spectrum = correlationSpectrum(W, dt, kind, 1, transformer).values;
    const d = v.dimensions;
    const removesCom = v.comDriftRemoved && g.nAtoms === traj.nAtoms;
    const dof = g.label === 'all' && options.degreesOfFreedom !== undefined ? options.degreesOfFreedom : d * g.nAtoms - (removesCom ? d : 0);
    const kTkin = W[0] / dof;
    const kT = options.normalisationTemperatureK !== undefined ? BOLTZMANN_ENGINE * options.normalisationTemperatureK : kTkin;
    const dos = new Float64Array(nFreq);
    for (let k = 0; k < nFreq; k++) dos[k] = (2 / kT) * spectrum[k];
    let integral = 0;
    for (let k = 0; k < nFreq; k++) integral += (k === 0 || k === nFreq - 1 ? 0.5 : 1) * dos[k];
    integral /= L * dt;
    const peaks = findPeaks(freqTHz, dos).map((p) => ({
      thz: p.position,
      cm1: p.position * WAVENUMBER_PER_THZ,
      meV: p.position * MEV_PER_THZ,
      fwhmThz: p.fwhm,
      fwhmCm1: p.fwhm * WAVENUMBER_PER_THZ,
      height: p.height,
    }));
    return {
      label: g.label,
      nAtoms: g.nAtoms,
      degreesOfFreedom: dof,
      dosPerThz: dos,
      integral,
      kineticTemperatureK: kTkin / BOLTZMANN_ENGINE,
      peaks,
      zeroFrequencyDA2PerPs: (dos[0] * kT) / (4 * d * g.totalMassU),
    };
  });
  const all = groups[0];
  const totalMass = v.groups[0].totalMassU;
  const thermoT = options.thermoTemperatureK ?? all.kineticTemperatureK;
  return {
    units: { frequency: 'THz', dos: 'modes/THz' },
    freqTHz,
    freqCm1: freqTHz.map((f) => f * WAVENUMBER_PER_THZ),
    freqMeV: freqTHz.map((f) => f * MEV_PER_THZ),
    binWidthThz: 1 / (L * dt),
    window: kind,
    fftLength: L,
    velocitySource: v.velocitySource,
    groups,
    thermo: harmonicThermo(freqTHz, all.dosPerThz, thermoT, all.nAtoms, totalMass),
    thermoNote:
      'Harmonic weights treat every mode as an oscillator; for liquids the ν→0 (diffusive) part makes the entropy approximate.',
  };
}
