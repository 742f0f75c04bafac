/**
 * Results of a series of runs (a state-point study): what the engine derives
 * from its members' reports. The server computes them, the API serves them,
 * the series page reads them; every quantity names its unit in its field.
 */
import type { DiffusionValue, MeanWithError, MotionRegime } from './report-summary.ts';

export type PhaseName = 'solid' | 'liquid' | 'vapour' | 'unclear';
export const PHASE_NAMES: readonly PhaseName[] = ['solid', 'liquid', 'vapour', 'unclear'];

/** How a member was reached: heating a colder state, cooling a hotter one, or not stated. */
export type Branch = 'heating' | 'cooling';

export type EvidenceKind = 'diffusion' | 'lindemann' | 'structure' | 'density' | 'structure-factor';

/**
 * What one piece of evidence points to. `fluid` is liquid or vapour,
 * `condensed` solid or liquid; `neutral` means the number is in between,
 * `missing` that the analysis behind it is not there.
 */
export type EvidenceVerdict = 'solid' | 'liquid' | 'vapour' | 'fluid' | 'condensed' | 'neutral' | 'missing';

export interface PhaseEvidence {
  kind: EvidenceKind;
  verdict: EvidenceVerdict;
  /** The measured number in its unit, or null when missing. */
  value: number | null;
  unit: string;
  /** The number, its error and the criterion it was held against, in words. */
  detail: string;
}

export interface MemberPhase {
  phase: PhaseName;
  /** Why this name, in one sentence. */
  reason: string;
  evidence: PhaseEvidence[];
}

/** Features of the total g(r) that separate crystal, liquid and gas. */
export interface RdfShape {
  firstPeak: { rA: number; g: number };
  /** Null when g(r) has no minimum after its first peak inside r_max. */
  firstMinimum: { rA: number; g: number; coordination: number | null } | null;
  /** g(r_min)/g(r_max) of the first shell (a Wendt–Abraham-type ratio). */
  minToPeakRatio: number | null;
  /** n·r₁³ of the most abundant species: about 1 for dense packing, ≪ 1 for a gas. */
  packing: number | null;
  /** The pair the shape was read from ("all" or "Ar-Ar"). */
  pair: string;
  /** False when g(r) has no first shell at all (an ideal-gas-like structure). */
  shells: boolean;
}

export interface MemberEnergy {
  /** Energy per atom, eV. */
  eV: number;
  stdError: number | null;
  kind: 'total' | 'kinetic';
}

export interface SeriesMemberResult {
  trajectoryId: number;
  name: string;
  position: number;
  branch: Branch | null;
  excludedFromFits: boolean;
  /** The temperature used in fits and charts: measured when the run has one, else stated. */
  temperatureK: number | null;
  temperatureSource: 'measured' | 'stated' | 'none';
  statedTemperatureK: number | null;
  measuredTemperatureK: MeanWithError | null;
  densityGPerCm3: MeanWithError | null;
  pressureBar: { value: number; stdError: number | null; source: 'stated' | 'virial' } | null;
  d: DiffusionValue | null;
  dStdError: DiffusionValue | null;
  motionRegime: MotionRegime | null;
  /** Lindemann ratio as the report states it (see methods for its form). */
  lindemannRatio: number | null;
  rdfShape: RdfShape | null;
  sqPeak: { qInvA: number; s: number } | null;
  energyPerAtom: MemberEnergy | null;
  /** Harmonic heat capacity from the VDOS (quantum weights), k_B per atom. */
  cvHarmonicPerAtomKB: number | null;
  /** Heat capacity from the run's own energy fluctuations, k_B per atom. */
  cvFluctuationPerAtomKB: { value: number; stdError: number | null } | null;
  phase: MemberPhase;
  /** Plain-language remarks: stated vs measured temperature, missing analyses. */
  notes: string[];
}

export interface ArrheniusPoint {
  trajectoryId: number;
  temperatureK: number;
  /** Å²/ps. */
  d: number;
  dStdError: number | null;
  /** ln D − fitted ln D. */
  lnResidual: number;
  /** Residual over its standard error, when the point has one. */
  normalisedResidual: number | null;
}

export interface ArrheniusFitResult {
  status: 'fitted' | 'not-enough-points';
  message: string | null;
  activationEnergy: { kJPerMol: number; eV: number } | null;
  activationEnergyStdError: { kJPerMol: number; eV: number } | null;
  d0: DiffusionValue | null;
  d0StdError: DiffusionValue | null;
  rangeK: { min: number; max: number } | null;
  points: ArrheniusPoint[];
  leftOut: { trajectoryId: number; reason: string }[];
  chiSquared: number | null;
  degreesOfFreedom: number;
  /**
   * `d-errors`: weights 1/σ²(ln D) from the members' D errors, parameter
   * errors scaled up by √(χ²/ν) when the scatter exceeds them;
   * `scatter`: equal weights, errors from the residual scatter;
   * `none`: two points without errors, no error can be given.
   */
  errorMethod: 'd-errors' | 'scatter' | 'none';
  warnings: string[];
}

export interface BracketEnd {
  trajectoryId: number;
  temperatureK: number;
}

export interface TransitionBracket {
  branch: Branch | 'all';
  /** Highest member still in the low-temperature phase. */
  below: BracketEnd | null;
  /** Lowest member already in the high-temperature phase. */
  above: BracketEnd | null;
  /** A high-temperature-phase member sits below a low-temperature-phase one. */
  overlap: boolean;
  message: string;
}

export interface TransitionResult {
  kind: 'melting' | 'boiling';
  lowPhase: PhaseName;
  highPhase: PhaseName;
  brackets: TransitionBracket[];
  /** Where heating and cooling branches both bracket it: the interval the true transition must lie in. */
  hysteresisBounds: { lowerK: number; upperK: number; message: string } | null;
  caution: string;
}

export interface CaloricPoint {
  trajectoryId: number;
  temperatureK: number;
  /** eV per atom. */
  energyPerAtomEV: number;
  stdError: number | null;
  phase: PhaseName;
  branch: Branch | null;
}

export interface LatentHeat {
  kJPerMol: number;
  eVPerAtom: number;
  stdErrorKJPerMol: number | null;
  stdErrorEVPerAtom: number | null;
  /** Temperature at which the two branches' lines were compared, K. */
  atK: number;
  method: string;
}

export interface CaloricCurve {
  energyKind: 'total' | 'kinetic' | 'mixed' | 'none';
  note: string;
  points: CaloricPoint[];
  latentHeat: LatentHeat | null;
  latentHeatNote: string;
}

export interface HeatCapacityPoint {
  temperatureK: number;
  perAtomKB: number;
  stdErrorKB: number | null;
  jPerMolK: number;
  source: 'slope' | 'fluctuation' | 'harmonic-vdos';
  /** The member(s) it comes from: two for a slope between neighbours. */
  trajectoryIds: number[];
  /** A slope whose two members are in different phases: it holds latent heat, not Cv. */
  acrossTransition: boolean;
  energyKind: 'total' | 'kinetic' | null;
}

/** Thresholds the phase names were decided with, for the methods text. */
export interface PhaseCriteria {
  mobilitySigmas: number;
  lindemannSolidBelow: number;
  lindemannFluidAbove: number;
  rdfOrderedBelow: number;
  rdfGasAbove: number;
  packingCondensedAbove: number;
  packingDiluteBelow: number;
  densityCondensedFraction: number;
  densityDiluteFraction: number;
  structureFactorFreezing: number;
  structureFactorGasBelow: number;
}

export interface SeriesResults {
  members: SeriesMemberResult[];
  arrhenius: ArrheniusFitResult;
  melting: TransitionResult;
  boiling: TransitionResult;
  caloric: CaloricCurve;
  heatCapacity: HeatCapacityPoint[];
  criteria: PhaseCriteria;
  warnings: string[];
}
