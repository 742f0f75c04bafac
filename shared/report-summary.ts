/**
 * Headline numbers of a report, one typed block per analysis. The engine
 * writes them, the API stores and serves them, the report page reads them:
 * every quantity carries its unit in its field name. Fields marked optional
 * were added in engine 0.2 and are absent from reports made before it.
 */

/** A diffusion coefficient in the three units the product reports. */
export interface DiffusionValue {
  a2PerPs: number;
  e9M2PerS: number;
  cm2PerS: number;
}

export type MotionRegime = 'diffusive' | 'subdiffusive' | 'superdiffusive' | 'bounded' | 'too-short';

export interface MsdGroupSummary {
  /** "all" or a species label. */
  label: string;
  atoms: number;
  regime: MotionRegime;
  /** Einstein D; null when the motion is bounded or the run too short for the automatic window. */
  d: DiffusionValue | null;
  dStdError: DiffusionValue | null;
  /** How dStdError was found ('fit-residuals' only in reports before engine 0.2). */
  uncertaintyMethod: 'atom-blocks' | 'time-blocks' | 'fit-residuals' | 'none';
  /** Independent blocks behind dStdError. */
  uncertaintyBlocks?: number;
  /** Log–log slope of the MSD over the fit window (1 diffusive, 2 ballistic, 0 bounded). */
  slopeExponent: number;
  fitWindowPs: { start: number; end: number; source: 'auto' | 'manual' };
  /** Mean MSD over the late window when bounded, Å². */
  plateauA2: number | null;
}

export interface MsdSummary {
  dimensions: number;
  groups: MsdGroupSummary[];
  /** Components the MSD and D are over ("xy" for a slab); absent in reports before engine 0.3. */
  components?: string;
  /** For a system periodic along some directions only: which repeat ("xy"), and how D was taken. */
  partlyPeriodic?: { periodicAxes: string; note: string } | null;
}

export interface VacfGroupSummary {
  label: string;
  atoms: number;
  /** D = (1/d)∫⟨v(0)·v(t)⟩dt over the plateau of the running integral. */
  dGreenKubo: DiffusionValue;
  /** Standard error from independent blocks of atoms or of time origins; null when neither is possible. */
  dStdError?: DiffusionValue | null;
  uncertaintyMethod?: 'atom-blocks' | 'time-blocks' | 'none';
  uncertaintyBlocks?: number;
  /** Spread of the running integral over the plateau window: how flat the plateau is, not an error bar. */
  spread: DiffusionValue;
  converged: boolean;
  plateauWindowPs: { start: number; end: number; source: 'auto' | 'manual' };
}

export interface VacfSummary {
  velocitySource: 'stored-velocities' | 'central-differences';
  groups: VacfGroupSummary[];
}

export interface VdosPeakSummary {
  thz: number;
  cm1: number;
  meV: number;
  fwhmCm1: number;
  /** Standard error of the position from independent atom blocks, cm⁻¹; null when too few blocks show the peak. */
  cm1StdError?: number | null;
}

/** Standard errors from independent groups of atoms (the number of groups given). */
export interface VdosStdErrors {
  blocks: number;
  kineticTemperatureK: number;
  /** Quantum harmonic values, per atom. */
  cvPerAtomKB: number;
  entropyPerAtomKB: number;
  zeroPointEvPerAtom: number;
}

/** Harmonic heat capacity, entropy or zero-point energy in the units a reader looks for. */
export interface HeatCapacityValue {
  perAtomKB: number;
  jPerMolK: number;
  jPerGK: number;
}

export interface EntropyValue {
  perAtomKB: number;
  jPerMolK: number;
}

/** How a spectrum from finite differences of positions was corrected (SCIENCE item 24). */
export interface DifferenceCorrectionSummary {
  /** The spectrum was divided by [sin(ωΔt)/(ωΔt)]² up to this wavenumber. */
  correctedUpToCm1: number;
  /** Share of the raw spectrum above it, where nothing can be restored. */
  uncorrectableFraction: number;
  /** Corrected over raw kinetic energy. */
  factor: number;
}

export interface VdosSummary {
  /** Temperature the harmonic weights were evaluated at, K. */
  temperatureK: number;
  /** Where temperatureK came from: the kinetic temperature, or one chosen for the analysis. */
  temperatureSource?: 'kinetic' | 'chosen';
  /** Kinetic temperature of the (corrected) spectrum with the counted degrees of freedom, K. */
  kineticTemperatureK?: number;
  /** The temperature the simulation states, K, or null. */
  statedTemperatureK?: number | null;
  /** Set when the kinetic temperature is more than 5 % from the stated one. */
  temperatureWarning?: string | null;
  /** Degrees of freedom of the analysed atoms, and how the whole system's were counted. */
  degreesOfFreedom?: number;
  degreesOfFreedomRule?: string;
  velocitySource?: 'stored-velocities' | 'central-differences';
  /** Null with stored velocities. */
  differenceCorrection?: DifferenceCorrectionSummary | null;
  /** Things a reader must not miss about the spectrum (coarse sampling). */
  warnings?: string[];
  /** Largest peaks of the "all" group, by height. */
  peaks: VdosPeakSummary[];
  /** Null with fewer than 5 atoms. */
  stdErrors?: VdosStdErrors | null;
  cv: { quantum: HeatCapacityValue; classical: HeatCapacityValue };
  entropy: { quantum: EntropyValue; classical: EntropyValue };
  zeroPoint: { evPerAtom: number; kJPerMol: number };
  /** Modes the spectrum is normalised to (degrees of freedom). */
  modes: number;
}

export interface RdfPairSummary {
  /** "all" (every pair of atoms) or a species pair such as "Ar-Ar". */
  label: string;
  firstPeak: { rA: number; g: number } | null;
  firstMinimum: { rA: number; coordination: number } | null;
}

export interface RdfSummary {
  pairs: RdfPairSummary[];
  /** Why g(r) was not computed (a slab, an open system), or absent when it was. */
  refused?: string;
}

export interface MeanWithError {
  mean: number;
  stdError: number;
}

export interface ThermoSummary {
  temperatureK: MeanWithError;
  /** The temperature the simulation states, K, or null. */
  statedTemperatureK?: number | null;
  /** How the degrees of freedom were counted, e.g. "3·256 − 128 constraints − 3 (centre of mass) = 253". */
  degreesOfFreedomRule?: string;
  velocitySource?: 'stored-velocities' | 'central-differences';
  /** Factor finite-difference kinetic energies were scaled by (1 with stored velocities). */
  differenceCorrection?: number;
  /** Things a reader must not miss. */
  warnings?: string[];
  /** Null without a periodic cell. */
  densityGPerCm3: MeanWithError | null;
  degreesOfFreedom: number;
  equilibrated: boolean;
  /**
   * When the run drifts: the equilibration discard, ps from the start of the
   * chosen range, after which the temperature series settles (automated
   * equilibration detection), to give as discardPs next time; null otherwise.
   * Absent in reports from before it was suggested.
   */
  suggestedDiscardPs?: number | null;
}

export interface LindemannSummary {
  /**
   * In the form of `form`: the per-atom rms displacement over r_nn for bulk
   * systems, the all-pairs distance fluctuation for finite clusters.
   */
  index: number;
  /** Absent in reports before engine 0.2, which mixed forms by system size. */
  form?: 'per-atom' | 'all-pairs';
  /** Nearest-neighbour distance r_nn, Å. */
  nearestNeighbourA?: number;
  threshold: number;
  melted: boolean;
  displacementRatio: number;
}

export interface NgpGroupSummary {
  /** A species, or "all" when the selection holds one species. */
  label: string;
  atoms: number;
  peakLagPs: number | null;
  peakAlpha2: number | null;
}

export interface NgpSummary {
  /** The peak of the single species analysed; null for a mixture, whose species are in `groups` (unlike atoms are never pooled). */
  peakLagPs: number | null;
  peakAlpha2: number | null;
  /** One per species (absent in reports before engine 0.2). */
  groups?: NgpGroupSummary[];
}

export interface SqSummary {
  firstPeak: { qInvA: number; s: number } | null;
  /** Why S(q) was not computed, or absent when it was. */
  refused?: string;
}

/** Heat capacity from energy fluctuations, per atom and per mass, with block errors. */
export interface FluctuationHeatCapacity {
  quantity: 'C_V' | 'C_P';
  method: string;
  temperatureK: number;
  perAtomKB: MeanWithError;
  jPerMolK: MeanWithError;
  jPerGK: MeanWithError;
}

export interface EnergyComparison {
  quantity: 'potential energy' | 'pressure';
  unit: 'eV/atom' | 'bar';
  fileMean: number;
  modelMean: number;
  meanDifference: number;
  rmsDifference: number;
  tolerance: number;
  agree: boolean;
}

export interface EnergySummary {
  atoms: number;
  ensemble: string | null;
  sources: { potential: string | null; kinetic: string; pressure: string | null };
  /** Potential energy per atom, eV (model, or file when there is no model). */
  potentialPerAtomEV: MeanWithError | null;
  kineticPerAtomEV: MeanWithError;
  totalPerAtomEV: MeanWithError | null;
  temperatureK: MeanWithError;
  pressureBar: MeanWithError | null;
  /** Mean pressure tensor, bar (model only). */
  pressureTensorBar: { xx: MeanWithError; yy: MeanWithError; zz: MeanWithError; xy: MeanWithError; xz: MeanWithError; yz: MeanWithError } | null;
  /** Mean analytic tail corrections included above, when asked for. */
  tail: { energyPerAtomEV: number; pressureBar: number } | null;
  /** Linear drift of the total energy and its fluctuation. */
  drift: { perAtomEVPerNs: number; stdError: number; relativeFluctuation: number; fluctuationRatio: number; totalStdPerAtomEV: number } | null;
  /** NVE conservation check against a threshold in k_B·T per atom per ns. */
  nveCheck: { thresholdKTPerNs: number; thresholdEVPerAtomPerNs: number; thresholdSource: string; status: 'within' | 'exceeds' | 'inconclusive' } | null;
  heatCapacity: FluctuationHeatCapacity | null;
  /** Why there is no heat capacity, when there is none. */
  heatCapacityNote: string | null;
  /** Which pressure is shown (the model's virial or the file's) and why the other, or the tensor, is missing. Absent in reports made before it existed. */
  pressureNote?: string;
  /** File energies or pressure set beside the model's. */
  comparisons: EnergyComparison[];
}

export interface ReportSummary {
  thermo?: ThermoSummary;
  msd?: MsdSummary;
  vacf?: VacfSummary;
  vdos?: VdosSummary;
  rdf?: RdfSummary;
  lindemann?: LindemannSummary;
  ngp?: NgpSummary;
  sq?: SqSummary;
  energy?: EnergySummary;
}
