/**
 * Vibrational density of states as the mass-weighted power spectrum of the
 * atoms' windowed velocities (SCIENCE item 25),
 *   S(ν) = (2/k_BT)·Σ_j m_j·P_j(ν),  P_j the two-sided spectral density of v_j,
 * which is the Fourier transform of the windowed velocity autocorrelation
 * (Wiener–Khinchin) and therefore ≥ 0 at every ν: heat capacity, entropy
 * and zero-point energy integrated over it keep their physical sign. With
 * this normalisation ∫₀^∞ S dν = degrees of freedom and S(0) = 12·m·N·D/(k_BT)
 * in 3-D (Lin, Blanco & Goddard, J. Chem. Phys. 119, 11792 (2003)).
 *
 * The window weights the middle of each segment more than its ends, so the
 * raw spectrum integrates to a window-weighted ⟨v²⟩; it is rescaled to the
 * plain time average, which makes ∫S = N_dof·T_kin/T exactly (discrete
 * Parseval). T defaults to that kinetic temperature.
 *
 * Without stored velocities the velocities are central differences of
 * positions, which damp a mode's power by [sin(ωΔt)/(ωΔt)]² (SCIENCE item 24).
 * The spectrum is divided by that factor up to ωΔt = 3π/4, and the kinetic
 * temperature is taken from the corrected spectrum; weight left above that
 * (modes near ωΔt = π) cannot be restored and is reported as a warning.
 */
import { AtomSeriesReader } from './atom-series.ts';
import { componentIndices, selectAtoms, type Components } from './atom-groups.ts';
import { BOLTZMANN_ENGINE, MEV_PER_THZ, WAVENUMBER_PER_THZ } from './constants.ts';
import { frameIntervalPs, lagCount } from './frame-timing.ts';
import { harmonicThermo, type HarmonicThermo } from './harmonic-thermo.ts';
import { findPeaks } from './peaks.ts';
import type { WindowFunction } from './spectral-windows.ts';
import { degreesOfFreedom, groupShare } from './degrees-of-freedom.ts';
import { atomBlockIndex } from './independent-blocks.ts';
import { chooseTemperature, type TemperatureChoice } from './temperature-choice.ts';
import { vdosErrors, type VdosErrors } from './vdos-errors.ts';
import type { Trajectory } from './trajectory.ts';
import { correctCentralDifferences, planSegments, VelocityPowerSpectrum, type DifferenceCorrection } from './velocity-spectrum.ts';

/** Share of the raw spectrum beyond the correctable range above which a report warns. */
export const UNCORRECTABLE_WARNING_FRACTION = 0.01;

export interface VdosOptions {
  species?: readonly string[];
  components?: Components;
  /** Longest correlation time resolved, ps: segments are twice this long (default: the whole run, one segment). */
  maxLagPs?: number;
  removeComDrift?: boolean;
  masses?: Readonly<Record<string, number>>;
  /** Use central differences of positions even when velocities are stored. */
  forceFromPositions?: boolean;
  window?: WindowFunction;
  /** Transform length is the next power of two ≥ segment·zeroPadFactor. */
  zeroPadFactor?: number;
  /** Degrees of freedom of the whole trajectory in 3-D, replacing the rule 3N − constraints − 3. */
  degreesOfFreedom?: number;
  /** Holonomic constraints of the whole trajectory. */
  constraints?: number | null;
  /** Temperature in S's normalisation; default the kinetic temperature. */
  normalisationTemperatureK?: number;
  /** Temperature chosen for heat capacity, entropy and zero-point energy (default the kinetic one). */
  thermoTemperatureK?: number;
  /** Temperature the simulation states, shown beside the one used. */
  statedTemperatureK?: number | null;
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
  /** Samples per segment and how many half-overlapping segments were averaged. */
  segmentFrames: number;
  segments: number;
  method: 'power spectrum of windowed velocities';
  velocitySource: 'stored-velocities' | 'central-differences';
  /** How the central-difference spectrum of the selection was corrected; null with stored velocities. */
  differenceCorrection: DifferenceCorrection | null;
  /** Things a reader must not miss about the spectrum (coarse sampling); the temperature's own warning is in `temperature`. */
  warnings: string[];
  groups: VdosGroupResult[];
  /** How the degrees of freedom of the whole trajectory were counted. */
  degreesOfFreedomRule: string;
  /** Which temperature the harmonic thermodynamics used, and why. */
  temperature: TemperatureChoice;
  /** Harmonic thermodynamics of the "all" group. */
  thermo: HarmonicThermo;
  /** Standard errors of the "all" group's kinetic temperature, Cv, S, ZPE and peaks from independent atom blocks; null with fewer than 5 atoms. */
  errors: VdosErrors | null;
  thermoNote: string;
}

export function vdos(traj: Trajectory, options: VdosOptions = {}, onProgress?: (fraction: number) => void): VdosResult {
  const dt = frameIntervalPs(traj);
  const dims = componentIndices(options.components ?? 'xyz');
  const sel = selectAtoms(traj, options.species, options.masses);
  const removeCom = options.removeComDrift ?? true;
  const useStored = traj.velocities !== undefined && !options.forceFromPositions;
  const reader = new AtomSeriesReader(useStored ? traj : { ...traj, velocities: undefined }, sel.masses, removeCom);
  const L = reader.velocityLength;
  if (L < 2) throw new Error('The VDOS needs at least two velocity frames (four frames without stored velocities).');
  const maxSegment = options.maxLagPs === undefined ? L : 2 * (lagCount(L, dt, options.maxLagPs, 0.5) - 1);
  const spectrum = new VelocityPowerSpectrum(planSegments(L, maxSegment, options.zeroPadFactor), options.window ?? 'hann', dt);
  const nFreq = spectrum.nFreq;

  const power = sel.groups.map(() => new Float64Array(nFreq));
  const plain = new Float64Array(sel.groups.length);
  const windowed = new Float64Array(sel.groups.length);
  const memberOf = sel.groups.map((g) => new Set(g.atoms));
  const atomPower = new Float64Array(nFreq);
  // Independent atom blocks of the first ("all") group, for the error bars.
  const blockPlan = atomBlockIndex(sel.groups[0].atoms.length);
  const blocks = Array.from({ length: blockPlan?.blocks ?? 0 }, () => ({ power: new Float64Array(nFreq), plain: 0, windowed: 0, atoms: 0 }));
  let member = 0;
  const velocities = new Float64Array(3 * L);
  const scratch = new Float64Array(3 * traj.nFrames);
  sel.atoms.forEach((atom, k) => {
    reader.velocities(atom, velocities, dt, scratch);
    atomPower.fill(0);
    let p = 0, w = 0;
    for (const c of dims) {
      const m = spectrum.add(velocities, c * L, atomPower);
      p += m.meanSquare;
      w += m.windowedMeanSquare;
    }
    const mass = sel.masses[atom];
    sel.groups.forEach((_, gi) => {
      if (!memberOf[gi].has(atom)) return;
      const out = power[gi];
      for (let f = 0; f < nFreq; f++) out[f] += mass * atomPower[f];
      plain[gi] += mass * p;
      windowed[gi] += mass * w;
    });
    if (blockPlan) {
      const block = blocks[blockPlan.of(member++)];
      for (let f = 0; f < nFreq; f++) block.power[f] += mass * atomPower[f];
      block.plain += mass * p;
      block.windowed += mass * w;
      block.atoms++;
    }
    onProgress?.((k + 1) / sel.atoms.length);
  });

  const freqTHz = spectrum.frequencies();
  const corrections = useStored ? null : power.map((p) => correctCentralDifferences(freqTHz, p, dt));
  const d = dims.length;
  const counted = degreesOfFreedom({ nAtoms: traj.nAtoms, removeComDrift: removeCom, constraints: options.constraints, degreesOfFreedom: options.degreesOfFreedom });
  const groups = sel.groups.map((g, gi): VdosGroupResult => {
    // Σm⟨v²⟩ of the true velocities: the raw time average times what the correction restored.
    const kinetic = plain[gi] * (corrections?.[gi].correctedOverRaw ?? 1);
    const dof = groupShare(counted, g.atoms.length, traj.nAtoms, d);
    const kTkin = kinetic / dof;
    const kT = options.normalisationTemperatureK !== undefined ? BOLTZMANN_ENGINE * options.normalisationTemperatureK : kTkin;
    const scale = windowed[gi] > 0 ? (2 / kT) * (plain[gi] / windowed[gi]) : 0;
    const dos = power[gi].map((v) => v * scale);
    let integral = 0;
    for (let k = 0; k < nFreq; k++) integral += (k === 0 || k === nFreq - 1 ? 0.5 : 1) * dos[k];
    integral *= spectrum.binWidth;
    let totalMass = 0;
    for (const a of g.atoms) totalMass += sel.masses[a];
    return {
      label: g.label,
      nAtoms: g.atoms.length,
      degreesOfFreedom: dof,
      dosPerThz: dos,
      integral,
      kineticTemperatureK: kTkin / BOLTZMANN_ENGINE,
      peaks: findPeaks(freqTHz, dos).map((p) => ({
        thz: p.position, cm1: p.position * WAVENUMBER_PER_THZ, meV: p.position * MEV_PER_THZ,
        fwhmThz: p.fwhm, fwhmCm1: p.fwhm * WAVENUMBER_PER_THZ, height: p.height,
      })),
      zeroFrequencyDA2PerPs: (dos[0] * kT) / (4 * d * totalMass),
    };
  });
  const all = groups[0];
  const temperature = chooseTemperature(all.kineticTemperatureK, options.thermoTemperatureK, options.statedTemperatureK);
  let totalMass = 0;
  for (const a of sel.groups[0].atoms) totalMass += sel.masses[a];
  const errors = vdosErrors({
    freqTHz, degreesOfFreedom: all.degreesOfFreedom, nAtoms: all.nAtoms, totalMassU: totalMass, chosenK: options.thermoTemperatureK, peaks: all.peaks.slice(0, 5),
    blocks: blocks.map((b) => {
      const ratio = useStored ? 1 : correctCentralDifferences(freqTHz, b.power, dt).correctedOverRaw;
      return { power: b.power, kinetic: b.plain * ratio, atoms: b.atoms };
    }),
  });
  return {
    units: { frequency: 'THz', dos: 'modes/THz' },
    freqTHz,
    freqCm1: freqTHz.map((f) => f * WAVENUMBER_PER_THZ),
    freqMeV: freqTHz.map((f) => f * MEV_PER_THZ),
    binWidthThz: spectrum.binWidth,
    window: spectrum.windowKind,
    fftLength: spectrum.plan.fftLength,
    segmentFrames: spectrum.plan.segment,
    segments: spectrum.plan.starts.length,
    method: 'power spectrum of windowed velocities',
    velocitySource: useStored ? 'stored-velocities' : 'central-differences',
    differenceCorrection: corrections?.[0] ?? null,
    warnings: corrections ? coarseSamplingWarnings(corrections[0], dt) : [],
    groups,
    degreesOfFreedomRule: counted.rule,
    temperature,
    thermo: harmonicThermo(freqTHz, all.dosPerThz, temperature.usedK, all.nAtoms, totalMass),
    errors,
    thermoNote:
      'Harmonic weights treat every mode as an oscillator; for liquids the ν→0 (diffusive) part makes the entropy approximate.',
  };
}

function coarseSamplingWarnings(c: DifferenceCorrection, dtPs: number): string[] {
  if (c.uncorrectableFraction <= UNCORRECTABLE_WARNING_FRACTION) return [];
  const limitCm1 = c.correctedUpToThz * WAVENUMBER_PER_THZ;
  const mode = c.strongestUncorrectableThz ?? c.correctedUpToThz;
  // ωΔt ≤ π/2 keeps the gain above 2/π, comfortably correctable.
  const neededFs = 1e3 / (4 * mode);
  return [
    `Frames are ${(dtPs * 1e3).toPrecision(3)} fs apart and carry no velocities: ${(100 * c.uncorrectableFraction).toPrecision(2)} % of the velocity spectrum ` +
    `lies above ${limitCm1.toPrecision(4)} cm⁻¹ (ωΔt > 3π/4), where finite differences of positions cannot be corrected, so temperature, ` +
    `heat capacity and peaks there read low. Store velocities, or frames at most ${neededFs.toPrecision(2)} fs apart ` +
    `(for the mode near ${(mode * WAVENUMBER_PER_THZ).toPrecision(4)} cm⁻¹).`,
  ];
}
