/**
 * The energy analysis: per-frame potential energy (from an interaction model
 * or from the file), kinetic and total energy, temperature, virial pressure
 * and its tensor; block-averaged means (Flyvbjerg–Petersen), total-energy
 * drift and fluctuation, an NVE conservation check, and the heat capacity
 * from fluctuations for the run's ensemble:
 *   NVT  C_V = ⟨δE²⟩/(k_B T²)                                    [common practice]
 *   NVE  C_V = (f k_B/2)/(1 − 2⟨δK²⟩/(f k_B² T²))               [Lebowitz, Percus & Verlet, Phys. Rev. 153, 250 (1967)]
 *   NPT  C_P = ⟨δH²⟩/(k_B T²), H = E + P·V                        [common practice]
 * with f the kinetic degrees of freedom (3N − 3 when momentum is conserved).
 * Pressure: P_αβ = [(3N/f)·Σ m v_α v_β + Σ_pairs r_α F_β]/V + P_tail δ_αβ, whose
 * trace/3 is P = [N k_B T + (1/3)Σ r·F]/V with T the kinetic temperature.
 *
 * Frames are evaluated one at a time (FrameEnergyEvaluator), so the potential
 * energy works the same for any frame source.
 */
import { BAR_PER_EV_PER_A3, BOLTZMANN_EV_PER_K, ENERGY_UNITS, PRESSURE_UNITS } from '../../shared/energy-units.ts';
import { GUESSED_POTENTIAL_KEYS, type FileQuantities } from '../../shared/file-quantities.ts';
import type { InteractionModel } from '../../shared/interaction-model.ts';
import { massOf } from '../../shared/elements.ts';
import { blockAverage, type BlockAverage } from './block-average.ts';
import { AVOGADRO_PER_MOL, BOLTZMANN_J_PER_K, ELEMENTARY_CHARGE_C, GRAM_PER_AMU, JOULE_PER_ENGINE_ENERGY } from './constants.ts';
import { fitLine } from './least-squares.ts';
import { compileModel, FrameEnergyEvaluator } from './pair-energy.ts';
import { degreesOfFreedomFor, kineticEnergies } from './thermo.ts';
import { FrameCursor } from './coordinate-blocks.ts';
import { vdos } from './vdos.ts';
import { cellFramesOf } from './cell-geometry.ts';
import type { Trajectory } from './trajectory.ts';

const EV_PER_ENGINE_ENERGY = JOULE_PER_ENGINE_ENERGY / ELEMENTARY_CHARGE_C;

/**
 * Default NVE drift threshold, in k_B·T per atom per ns: a rule of thumb of
 * the trade for "energy is conserved well enough" (common practice, not a
 * published standard); every report says it can be changed.
 */
export const DEFAULT_DRIFT_THRESHOLD_KT_PER_NS = 0.01;

/** File and model agree when their per-atom means differ by at most this (eV) or this fraction of |U|, whichever is larger. */
export const AGREEMENT_EV_PER_ATOM = 1e-4;
export const AGREEMENT_RELATIVE = 1e-3;

export type Ensemble = 'NVE' | 'NVT' | 'NPT' | 'other';

export interface EnergyOptions {
  model?: InteractionModel | null;
  fileQuantities?: FileQuantities | null;
  masses?: Readonly<Record<string, number>>;
  degreesOfFreedom?: number;
  constraints?: number;
  /**
   * Temperature and the kinetic part of the pressure leave out the centre-of-mass
   * motion (matching f = 3N − N_c − 3); the total energy keeps all of it. Default true.
   */
  removeComDrift?: boolean;
  ensemble?: Ensemble | null;
  /** Thermostat temperature for C_V/C_P (NVT, NPT); default the mean kinetic temperature. */
  temperatureK?: number;
  /** Barostat pressure for the enthalpy (NPT); default the mean virial pressure. */
  externalPressureBar?: number;
  driftThresholdKTPerNs?: number;
}

export interface HeatCapacityEstimate {
  quantity: 'C_V' | 'C_P';
  method: 'canonical total-energy fluctuation' | 'microcanonical kinetic-energy fluctuation (Lebowitz–Percus–Verlet)' | 'isobaric enthalpy fluctuation';
  temperatureK: number;
  temperatureSource: 'given' | 'kinetic mean';
  perAtomKB: number;
  perAtomKBStdError: number;
  jPerMolK: number;
  jPerMolKStdError: number;
  jPerGK: number;
  jPerGKStdError: number;
  /** Pressure used in H = E + PV (NPT only), bar. */
  pressureBar?: number;
}

export interface Comparison {
  quantity: 'potential energy' | 'pressure';
  unit: 'eV/atom' | 'bar';
  fileMean: number;
  modelMean: number;
  meanDifference: number;
  /** Root-mean-square of the frame-by-frame difference after removing its mean. */
  rmsDifference: number;
  tolerance: number;
  agree: boolean;
}

export interface EnergyResult {
  atoms: number;
  degreesOfFreedom: number;
  timesPs: Float64Array;
  sources: {
    potential: 'model' | 'file' | 'file total minus kinetic' | null;
    kinetic: 'stored velocities' | 'finite differences' | 'file temperature' | string;
    pressure: 'virial' | 'file' | null;
    /** Keys read from the file and what they were taken as. */
    fileKeys: { quantity: string; key: string; unit: string; guessed: boolean }[];
  };
  potentialPerAtomEV: Float64Array | null;
  kineticPerAtomEV: Float64Array;
  totalPerAtomEV: Float64Array | null;
  temperatureK: Float64Array;
  pressureBar: Float64Array | null;
  /** xx, yy, zz, xy, xz, yz per frame, bar (model only). */
  pressureTensorBar: Float64Array[] | null;
  volumeA3: Float64Array | null;
  filePotentialPerAtomEV: Float64Array | null;
  filePressureBar: Float64Array | null;
  means: {
    potentialPerAtomEV: BlockAverage | null;
    kineticPerAtomEV: BlockAverage;
    totalPerAtomEV: BlockAverage | null;
    temperatureK: BlockAverage;
    pressureBar: BlockAverage | null;
    pressureTensorBar: BlockAverage[] | null;
  };
  tail: { energyPerAtomEV: number; pressureBar: number } | null;
  drift: {
    perAtomEVPerNs: number;
    stdError: number;
    /** σ(E_total)/|⟨E_total⟩|. */
    relativeFluctuation: number;
    /** σ(E_total)/σ(E_kinetic): well below 1 when the integrator conserves energy. */
    fluctuationRatio: number;
    totalStdPerAtomEV: number;
  } | null;
  nveCheck: {
    thresholdKTPerNs: number;
    thresholdEVPerAtomPerNs: number;
    thresholdSource: 'default (common practice)' | 'given';
    status: 'within' | 'exceeds' | 'inconclusive';
  } | null;
  heatCapacity: HeatCapacityEstimate | null;
  heatCapacityNote: string;
  /** What pressure is shown and why (file or virial, and why the other or the tensor is missing). */
  pressureNote: string;
  comparisons: Comparison[];
  modelPairs: number;
}

/**
 * Kinetic energy from differences of positions over the true one: the ratio
 * of the spectrum divided by the difference operator's transfer function to
 * the raw spectrum (SCIENCE item 24), as the temperature analysis takes it.
 * Only this ratio is read; the spectrum's harmonic sums need some positive
 * temperature, so one is given.
 */
function differenceCorrection(traj: Trajectory, masses: Readonly<Record<string, number>> | undefined, removeComDrift: boolean, degreesOfFreedom: number): number {
  return vdos(traj, { masses, removeComDrift, degreesOfFreedom, thermoTemperatureK: 300 }).differenceCorrection?.correctedOverRaw ?? 1;
}

export function energy(traj: Trajectory, options: EnergyOptions = {}, onProgress?: (fraction: number) => void): EnergyResult {
  const N = traj.nAtoms, T = traj.nFrames;
  const masses = Float64Array.from(traj.species, (s) => massOf(s, options.masses));
  const removeCom = options.removeComDrift ?? true;
  const dof = degreesOfFreedomFor(N, { degreesOfFreedom: options.degreesOfFreedom, constraints: options.constraints, removeComDrift: removeCom });
  if (!(dof > 0)) throw new Error('Degrees of freedom must be positive.');
  if (traj.boundary === 'periodic' && (!traj.cells || traj.cells.length !== 9 * T)) throw new Error('A periodic trajectory needs one cell (9 numbers) per frame.');
  const geometry = cellFramesOf(traj);
  /** Which directions repeat: images are taken only along these. */
  const periodicAxes = geometry?.periodic ?? null;
  // Volume, pressure and the tail correction need a homogeneous system filling a cell repeating in all three directions.
  const periodic = geometry !== null && !geometry.partlyPeriodic;

  const file = readFileQuantities(traj, options.fileQuantities ?? null);
  if (!options.model && !file.potentialEV && !file.totalEV) {
    throw new Error('The energy analysis needs an interaction model or energies in the file: give the trajectory (or its project) an interaction model, or map a file key to potential or total energy in its metadata.');
  }

  // Kinetic energy and its tensor (u·Å²/ps²) per frame.
  const kinetic = new Float64Array(T);
  /** Kinetic energy without the centre-of-mass motion when that is removed (temperature, pressure). */
  const internal = new Float64Array(T);
  const kineticTensor = new Float64Array(6 * T);
  let totalMass = 0;
  for (let i = 0; i < N; i++) totalMass += masses[i];
  let kineticSource: EnergyResult['sources']['kinetic'];
  const v = traj.velocities;
  if (v) {
    kineticSource = 'stored velocities';
    const velocityFrames = new FrameCursor(traj, 'velocities');
    for (let f = 0; f < T; f++) {
      let xx = 0, yy = 0, zz = 0, xy = 0, xz = 0, yz = 0, px = 0, py = 0, pz = 0;
      const { data: v, offset: base } = velocityFrames.frame(f);
      for (let i = 0; i < N; i++) {
        const p = base + 3 * i, m = masses[i];
        const vx = v[p], vy = v[p + 1], vz = v[p + 2];
        xx += m * vx * vx;
        yy += m * vy * vy;
        zz += m * vz * vz;
        xy += m * vx * vy;
        xz += m * vx * vz;
        yz += m * vy * vz;
        px += m * vx;
        py += m * vy;
        pz += m * vz;
      }
      kinetic[f] = 0.5 * (xx + yy + zz);
      if (removeCom) {
        // Take out P⊗P/M, the centre-of-mass part of Σ m v⊗v.
        const M = totalMass;
        xx -= (px * px) / M, yy -= (py * py) / M, zz -= (pz * pz) / M, xy -= (px * py) / M, xz -= (px * pz) / M, yz -= (py * pz) / M;
      }
      internal[f] = 0.5 * (xx + yy + zz);
      kineticTensor.set([xx, yy, zz, xy, xz, yz], 6 * f);
    }
  } else if (file.temperatureK) {
    kineticSource = 'file temperature';
    for (let f = 0; f < T; f++) {
      kinetic[f] = (0.5 * dof * BOLTZMANN_EV_PER_K * file.temperatureK[f]) / EV_PER_ENGINE_ENERGY;
      internal[f] = kinetic[f];
      const iso = (2 * kinetic[f]) / 3;
      kineticTensor.set([iso, iso, iso, 0, 0, 0], 6 * f);
    }
  } else {
    // The same rule as the temperature analysis: differences of positions damp each mode by
    // sin(ωΔt)/(ωΔt), so their kinetic energy is scaled by the factor the spectrum's correction gives.
    kinetic.set(kineticEnergies(traj, masses));
    const correction = T >= 4 && kinetic.some((k) => k > 0) ? differenceCorrection(traj, options.masses, removeCom, dof) : null;
    if (correction !== null) for (let f = 0; f < T; f++) kinetic[f] *= correction;
    kineticSource = correction !== null
      ? `differences of positions, scaled by ${correction.toFixed(4)} to undo their sin(ωΔt)/(ωΔt) damping (the correction the temperature analysis applies)`
      : T >= 4 ? 'differences of positions (no motion to correct)' : 'differences of positions, uncorrected (too few frames to correct their damping: reads low)';
    internal.set(kinetic);
    for (let f = 0; f < T; f++) {
      const iso = (2 * kinetic[f]) / 3;
      kineticTensor.set([iso, iso, iso, 0, 0, 0], 6 * f);
    }
  }
  const kineticPerAtomEV = kinetic.map((k) => (k * EV_PER_ENGINE_ENERGY) / N);
  const temperatureK = internal.map((k) => (2 * k * EV_PER_ENGINE_ENERGY) / (dof * BOLTZMANN_EV_PER_K));

  // Potential energy and virial from the model, frame by frame.
  let modelPotential: Float64Array | null = null;
  let pressureBar: Float64Array | null = null;
  let pressureTensorBar: Float64Array[] | null = null;
  let volumeA3: Float64Array | null = periodic ? new Float64Array(T) : null;
  let tail: EnergyResult['tail'] = null;
  let modelPairs = 0;
  if (options.model) {
    const compiled = compileModel(options.model, traj.species);
    modelPairs = compiled.pairs.length;
    const evaluator = new FrameEnergyEvaluator(compiled, traj.species);
    modelPotential = new Float64Array(T);
    if (periodic) {
      pressureBar = new Float64Array(T);
      pressureTensorBar = Array.from({ length: 6 }, () => new Float64Array(T));
    }
    let tailU = 0, tailP = 0;
    const positionFrames = new FrameCursor(traj, 'positions');
    for (let f = 0; f < T; f++) {
      let e: ReturnType<FrameEnergyEvaluator['evaluate']>;
      try {
        const here = positionFrames.frame(f);
        e = evaluator.evaluate(here.data, here.offset, periodicAxes ? traj.cells : null, 9 * f, periodicAxes ?? undefined);
      } catch (err) {
        throw new Error(`frame ${f + 1}: ${err instanceof Error ? err.message : String(err)}`);
      }
      modelPotential[f] = e.pairEV + e.tailEV;
      if (periodic && pressureBar && pressureTensorBar && volumeA3) {
        const V = e.volumeA3;
        volumeA3[f] = V;
        const scale = (3 * N) / dof;
        for (let c = 0; c < 6; c++) {
          const kin = kineticTensor[6 * f + c] * EV_PER_ENGINE_ENERGY * scale;
          pressureTensorBar[c][f] = ((kin + e.virialEV[c]) / V + (c < 3 ? e.tailPressureEVPerA3 : 0)) * BAR_PER_EV_PER_A3;
        }
        pressureBar[f] = (pressureTensorBar[0][f] + pressureTensorBar[1][f] + pressureTensorBar[2][f]) / 3;
        tailU += e.tailEV;
        tailP += e.tailPressureEVPerA3;
      }
      if ((f & 31) === 0) onProgress?.(f / T);
    }
    if (tailU !== 0 || tailP !== 0) tail = { energyPerAtomEV: tailU / T / N, pressureBar: (tailP / T) * BAR_PER_EV_PER_A3 };
  } else if (periodic && volumeA3 && traj.cells) {
    for (let f = 0; f < T; f++) volumeA3[f] = cellVolume(traj.cells, 9 * f);
  }
  if (!periodic) volumeA3 = null;

  // Which potential energy the report uses: the model's when there is one, else the file's.
  let potentialSystemEV: Float64Array | null = modelPotential;
  let potentialSource: EnergyResult['sources']['potential'] = modelPotential ? 'model' : null;
  if (!potentialSystemEV && file.potentialEV) {
    potentialSystemEV = file.potentialEV;
    potentialSource = 'file';
  } else if (!potentialSystemEV && file.totalEV) {
    const total = file.totalEV;
    potentialSystemEV = total.map((e, f) => e - kinetic[f] * EV_PER_ENGINE_ENERGY);
    potentialSource = 'file total minus kinetic';
  }
  const potentialPerAtomEV = potentialSystemEV ? potentialSystemEV.map((u) => u / N) : null;
  const totalPerAtomEV = potentialPerAtomEV ? potentialPerAtomEV.map((u, f) => u + kineticPerAtomEV[f]) : null;
  let pressureSource: EnergyResult['sources']['pressure'] = pressureBar ? 'virial' : null;
  if (!pressureBar && file.pressureBar) {
    pressureBar = file.pressureBar;
    pressureSource = 'file';
  }

  const means = {
    potentialPerAtomEV: potentialPerAtomEV ? blockAverage(potentialPerAtomEV) : null,
    kineticPerAtomEV: blockAverage(kineticPerAtomEV),
    totalPerAtomEV: totalPerAtomEV ? blockAverage(totalPerAtomEV) : null,
    temperatureK: blockAverage(temperatureK),
    pressureBar: pressureBar ? blockAverage(pressureBar) : null,
    pressureTensorBar: pressureTensorBar ? pressureTensorBar.map((p) => blockAverage(p)) : null,
  };

  const drift = totalPerAtomEV ? driftOf(traj.times, totalPerAtomEV, kineticPerAtomEV) : null;
  const meanT = means.temperatureK.mean;
  let nveCheck: EnergyResult['nveCheck'] = null;
  if (drift && options.ensemble === 'NVE') {
    const kt = options.driftThresholdKTPerNs ?? DEFAULT_DRIFT_THRESHOLD_KT_PER_NS;
    const limit = kt * BOLTZMANN_EV_PER_K * meanT;
    const d = Math.abs(drift.perAtomEVPerNs), se = drift.stdError;
    const status = d - 2 * se > limit ? 'exceeds' : d + 2 * se <= limit ? 'within' : 'inconclusive';
    nveCheck = { thresholdKTPerNs: kt, thresholdEVPerAtomPerNs: limit, thresholdSource: options.driftThresholdKTPerNs === undefined ? 'default (common practice)' : 'given', status };
  }

  const totalMassG = masses.reduce((a, b) => a + b, 0) * GRAM_PER_AMU;
  const { estimate: heatCapacity, note: heatCapacityNote } = heatCapacityFor(options, {
    N, dof, totalMassG, meanT, kineticEV: kineticPerAtomEV.map((k) => k * N), totalEV: totalPerAtomEV?.map((e) => e * N) ?? null,
    pressureBar, meanPressureBar: means.pressureBar?.mean, volumeA3,
  });

  const comparisons: Comparison[] = [];
  if (modelPotential && file.potentialEV) {
    comparisons.push(compare('potential energy', 'eV/atom', file.potentialEV.map((u) => u / N), modelPotential.map((u) => u / N), (m) => Math.max(AGREEMENT_EV_PER_ATOM, AGREEMENT_RELATIVE * Math.abs(m))));
  } else if (modelPotential && file.totalEV && totalPerAtomEV) {
    const fileU = file.totalEV.map((e, f) => e / N - kineticPerAtomEV[f]);
    comparisons.push(compare('potential energy', 'eV/atom', fileU, modelPotential.map((u) => u / N), (m) => Math.max(AGREEMENT_EV_PER_ATOM, AGREEMENT_RELATIVE * Math.abs(m))));
  }
  if (pressureSource === 'virial' && file.pressureBar && pressureBar) {
    // Kinetic conventions differ between codes by ~1/N; a 1 % or 5 bar band covers that.
    comparisons.push(compare('pressure', 'bar', file.pressureBar, pressureBar, (m) => Math.max(5, 0.01 * Math.abs(m))));
  }

  const pressureKey = file.keys.find((k) => k.quantity === 'pressure');
  const pressureNote = pressureNoteFor({
    source: pressureSource, hasModel: options.model != null, periodic: periodic && volumeA3 !== null, slab: geometry?.partlyPeriodic === true,
    fileKey: pressureKey ? `"${pressureKey.key}" in ${pressureKey.unit}` : null, fileHasNumbers: Object.keys(traj.observables ?? {}).some((k) => !file.keys.some((used) => used.key.toLowerCase() === k)),
  });

  onProgress?.(1);
  return {
    atoms: N, degreesOfFreedom: dof, timesPs: traj.times,
    sources: { potential: potentialSource, kinetic: kineticSource, pressure: pressureSource, fileKeys: file.keys },
    potentialPerAtomEV, kineticPerAtomEV, totalPerAtomEV, temperatureK, pressureBar, pressureTensorBar, volumeA3,
    filePotentialPerAtomEV: file.potentialEV && modelPotential ? file.potentialEV.map((u) => u / N) : null,
    filePressureBar: pressureSource === 'virial' ? file.pressureBar : null,
    means, tail, drift, nveCheck, heatCapacity, heatCapacityNote, pressureNote, comparisons, modelPairs,
  };
}

interface PressureFacts {
  source: EnergyResult['sources']['pressure'];
  hasModel: boolean;
  periodic: boolean;
  /** Periodic along some directions only: a cell without a volume the pressure could use. */
  slab: boolean;
  /** The file key mapped to the pressure, with its unit. */
  fileKey: string | null;
  /** The file has per-frame numbers not taken as any quantity (one of them could be a pressure). */
  fileHasNumbers: boolean;
}

/**
 * Which pressure the report shows and why the other is missing: the
 * virial (and its tensor) needs pair forces from a model and a periodic
 * cell volume; the file's pressure needs a key mapped to it.
 */
export function pressureNoteFor(f: PressureFacts): string {
  const noVirial = !f.hasModel
    ? 'there is no interaction model, so no virial pressure and no pressure tensor (both need the pair forces)'
    : `the model's virial pressure and tensor need a periodic cell volume, and this run ${f.slab ? 'is periodic along some directions only (a slab)' : 'has open boundaries'}`;
  if (f.source === 'virial') {
    if (f.fileKey) return `Shown: the virial pressure and its tensor from the interaction model, beside the file's pressure (key ${f.fileKey}).`;
    return f.fileHasNumbers
      ? 'Shown: the virial pressure and its tensor from the interaction model; none of the file\'s per-frame numbers is mapped as the pressure, so there is nothing to compare it with (map one in the metadata).'
      : 'Shown: the virial pressure and its tensor from the interaction model; the file states no pressure to compare it with.';
  }
  if (f.source === 'file') return `Shown: the pressure as the file states it, key ${f.fileKey}, a scalar per frame without a tensor; ${noVirial}.`;
  return `No pressure: the file states none${f.fileHasNumbers ? ' (no per-frame number is mapped as the pressure)' : ''}, and ${noVirial}.`;
}

interface FileSeries {
  potentialEV: Float64Array | null;
  totalEV: Float64Array | null;
  pressureBar: Float64Array | null;
  temperatureK: Float64Array | null;
  keys: EnergyResult['sources']['fileKeys'];
}

/** The mapped (or, for the potential energy, guessed) per-frame file numbers, converted to eV, bar and K. */
function readFileQuantities(traj: Trajectory, map: FileQuantities | null): FileSeries {
  const obs = traj.observables ?? {};
  const out: FileSeries = { potentialEV: null, totalEV: null, pressureBar: null, temperatureK: null, keys: [] };
  const series = (quantity: string, key: string, factor: number, unit: string, guessed: boolean): Float64Array => {
    const s = obs[key.toLowerCase()];
    if (!s) {
      const known = Object.keys(obs);
      throw new Error(`the file has no per-frame key "${key}" for the ${quantity}${known.length ? `; it has ${known.join(', ')}` : '; it carries no per-frame numbers'}`);
    }
    const missing = s.findIndex((x) => !Number.isFinite(x));
    if (missing >= 0) throw new Error(`frame ${missing + 1} has no number for "${key}" (the ${quantity})`);
    out.keys.push({ quantity, key, unit, guessed });
    return s.map((x) => x * factor);
  };
  if (map?.potentialEnergy) out.potentialEV = series('potential energy', map.potentialEnergy.key, ENERGY_UNITS[map.potentialEnergy.unit], map.potentialEnergy.unit, false);
  if (map?.totalEnergy) out.totalEV = series('total energy', map.totalEnergy.key, ENERGY_UNITS[map.totalEnergy.unit], map.totalEnergy.unit, false);
  if (map?.pressure) out.pressureBar = series('pressure', map.pressure.key, PRESSURE_UNITS[map.pressure.unit], map.pressure.unit, false);
  if (map?.temperature) out.temperatureK = series('temperature', map.temperature.key, 1, 'K', false);
  if (!map?.potentialEnergy && !map?.totalEnergy) {
    const guess = GUESSED_POTENTIAL_KEYS.find((k) => obs[k] && obs[k].every(Number.isFinite));
    if (guess) out.potentialEV = series('potential energy', guess, 1, 'eV', true);
  }
  return out;
}

function driftOf(times: Float64Array, total: Float64Array, kinetic: Float64Array): EnergyResult['drift'] {
  if (total.length < 3) return null;
  const fit = fitLine(times, total);
  const residuals = total.map((e, f) => e - fit.intercept - fit.slope * times[f]);
  // Correlated residuals: widen the ordinary slope error by √g from blocking.
  const g = residuals.length >= 32 ? Math.max(1, blockAverage(residuals).inefficiency) : 1;
  const sd = (x: Float64Array): number => {
    const m = x.reduce((a, b) => a + b, 0) / x.length;
    return Math.sqrt(x.reduce((a, b) => a + (b - m) ** 2, 0) / (x.length - 1));
  };
  const sE = sd(total), sK = sd(kinetic);
  const meanE = total.reduce((a, b) => a + b, 0) / total.length;
  return {
    perAtomEVPerNs: fit.slope * 1000,
    stdError: fit.slopeStdError * Math.sqrt(g) * 1000,
    relativeFluctuation: sE / Math.abs(meanE),
    fluctuationRatio: sK > 0 ? sE / sK : NaN,
    totalStdPerAtomEV: sE,
  };
}

/** Variance of a series with its standard error by blocking the squared deviations. */
function varianceWithError(x: Float64Array): { variance: number; stdError: number } {
  const n = x.length;
  const mean = x.reduce((a, b) => a + b, 0) / n;
  const sq = x.map((v) => (v - mean) ** 2);
  const b = blockAverage(sq);
  return { variance: (b.mean * n) / (n - 1), stdError: (b.stdError * n) / (n - 1) };
}

interface HeatInputs {
  N: number;
  dof: number;
  totalMassG: number;
  meanT: number;
  kineticEV: Float64Array;
  totalEV: Float64Array | null;
  pressureBar: Float64Array | null;
  meanPressureBar: number | undefined;
  volumeA3: Float64Array | null;
}

function heatCapacityFor(options: EnergyOptions, h: HeatInputs): { estimate: HeatCapacityEstimate | null; note: string } {
  const ensemble = options.ensemble ?? null;
  const kB = BOLTZMANN_EV_PER_K;
  if (h.kineticEV.length < 64) return { estimate: null, note: 'Too few frames (fewer than 64) for a fluctuation heat capacity.' };
  const finish = (quantity: HeatCapacityEstimate['quantity'], method: HeatCapacityEstimate['method'], tK: number, given: boolean, perSystemKB: number, seKB: number, extra: Partial<HeatCapacityEstimate> = {}): HeatCapacityEstimate => {
    const perAtom = perSystemKB / h.N, se = seKB / h.N;
    const jPerMolK = perAtom * BOLTZMANN_J_PER_K * AVOGADRO_PER_MOL;
    const jPerMolKSe = se * BOLTZMANN_J_PER_K * AVOGADRO_PER_MOL;
    const jPerGK = (perSystemKB * BOLTZMANN_J_PER_K) / h.totalMassG, jPerGKSe = (seKB * BOLTZMANN_J_PER_K) / h.totalMassG;
    return { quantity, method, temperatureK: tK, temperatureSource: given ? 'given' : 'kinetic mean', perAtomKB: perAtom, perAtomKBStdError: se, jPerMolK, jPerMolKStdError: jPerMolKSe, jPerGK, jPerGKStdError: jPerGKSe, ...extra };
  };
  if (ensemble === 'NVT') {
    if (!h.totalEV) return { estimate: null, note: 'NVT heat capacity needs the total energy (a model or file energies).' };
    const tK = options.temperatureK ?? h.meanT;
    const { variance, stdError } = varianceWithError(h.totalEV);
    const k = 1 / (kB * kB * tK * tK);
    return { estimate: finish('C_V', 'canonical total-energy fluctuation', tK, options.temperatureK !== undefined, variance * k, stdError * k), note: '' };
  }
  if (ensemble === 'NVE') {
    const tK = h.meanT;
    const { variance, stdError } = varianceWithError(h.kineticEV);
    const q = (2 * variance) / (h.dof * kB * kB * tK * tK);
    if (!(q < 1)) return { estimate: null, note: 'The kinetic-energy fluctuations are too large for the Lebowitz–Percus–Verlet formula (the run is not microcanonical, or not equilibrated).' };
    const c = (0.5 * h.dof) / (1 - q);
    const dcdVar = (0.5 * h.dof) / (1 - q) ** 2 * (2 / (h.dof * kB * kB * tK * tK));
    return { estimate: finish('C_V', 'microcanonical kinetic-energy fluctuation (Lebowitz–Percus–Verlet)', tK, false, c, dcdVar * stdError), note: '' };
  }
  if (ensemble === 'NPT') {
    if (!h.totalEV) return { estimate: null, note: 'NPT heat capacity needs the total energy (a model or file energies).' };
    if (!h.volumeA3) return { estimate: null, note: 'NPT heat capacity needs a periodic cell for the volume.' };
    const pBar = options.externalPressureBar ?? h.meanPressureBar;
    if (pBar === undefined) return { estimate: null, note: 'NPT heat capacity needs the pressure: give the barostat pressure, or a model or file pressure.' };
    const pEV = pBar / BAR_PER_EV_PER_A3;
    const enthalpy = h.totalEV.map((e, f) => e + pEV * h.volumeA3![f]);
    const tK = options.temperatureK ?? h.meanT;
    const { variance, stdError } = varianceWithError(enthalpy);
    const k = 1 / (kB * kB * tK * tK);
    return { estimate: finish('C_P', 'isobaric enthalpy fluctuation', tK, options.temperatureK !== undefined, variance * k, stdError * k, { pressureBar: pBar }), note: '' };
  }
  return { estimate: null, note: 'Set the run\'s ensemble (NVE, NVT or NPT) in its metadata: each ensemble has its own fluctuation formula.' };
}

function compare(quantity: Comparison['quantity'], unit: Comparison['unit'], fileSeries: Float64Array, modelSeries: Float64Array, tolerance: (mean: number) => number): Comparison {
  const n = fileSeries.length;
  let fm = 0, mm = 0;
  for (let f = 0; f < n; f++) {
    fm += fileSeries[f];
    mm += modelSeries[f];
  }
  fm /= n;
  mm /= n;
  const diff = fm - mm;
  let rms = 0;
  for (let f = 0; f < n; f++) rms += (fileSeries[f] - modelSeries[f] - diff) ** 2;
  rms = Math.sqrt(rms / n);
  const tol = tolerance(mm);
  return { quantity, unit, fileMean: fm, modelMean: mm, meanDifference: diff, rmsDifference: rms, tolerance: tol, agree: Math.abs(diff) <= tol && rms <= tol };
}

function cellVolume(H: Float64Array, o: number): number {
  return Math.abs(H[o] * (H[o + 4] * H[o + 8] - H[o + 5] * H[o + 7]) - H[o + 1] * (H[o + 3] * H[o + 8] - H[o + 5] * H[o + 6]) + H[o + 2] * (H[o + 3] * H[o + 7] - H[o + 4] * H[o + 6]));
}
