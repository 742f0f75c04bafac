/**
 * Kinetic energy and temperature per frame by equipartition,
 * T = 2·KE/(N_dof·k_B), and density per frame, with block-averaged means.
 * N_dof defaults to 3N − 3 (total momentum conserved, as in periodic MD);
 * pass constraints or an explicit count for rigid molecules or thermostats
 * that do not conserve momentum. Without stored velocities, central
 * differences of minimum-image positions are used for interior frames and
 * one-sided differences at the two ends.
 *
 * Equilibration flag: the means of the first and last thirds (each with its
 * own blocking error) must agree within EQUILIBRATION_SIGMAS combined errors.
 */
import { massOf } from '../../shared/elements.ts';
import { blockAverage, type BlockAverage } from './block-average.ts';
import { cellFramesOf, minimumImage } from './cell-geometry.ts';
import { BOLTZMANN_ENGINE, GRAM_PER_AMU, CM3_PER_A3, JOULE_PER_ENGINE_ENERGY, ELEMENTARY_CHARGE_C } from './constants.ts';
import { frameIntervalPs } from './frame-timing.ts';
import type { Trajectory } from './trajectory.ts';

export const EQUILIBRATION_SIGMAS = 3;

export interface ThermoOptions {
  /** Total degrees of freedom; overrides the default 3N − 3 − constraints. */
  degreesOfFreedom?: number;
  /** Holonomic constraints (e.g. 3 per rigid water). */
  constraints?: number;
  /** Whether total momentum is conserved/removed (subtracts 3; default true). */
  momentumConserved?: boolean;
  masses?: Readonly<Record<string, number>>;
}

export interface EquilibrationCheck {
  firstThirdMean: number;
  lastThirdMean: number;
  drift: number;
  combinedError: number;
  equilibrated: boolean;
}

export interface ThermoResult {
  units: { time: 'ps'; kineticEnergy: 'eV'; temperature: 'K'; density: 'g/cm³'; numberDensity: 'atoms/Å³' };
  timesPs: Float64Array;
  degreesOfFreedom: number;
  velocitySource: 'stored-velocities' | 'finite-differences';
  kineticEnergyEV: Float64Array;
  temperatureK: Float64Array;
  /** Null without a periodic cell. */
  densityGPerCm3: Float64Array | null;
  numberDensityPerA3: Float64Array | null;
  temperature: BlockAverage;
  density: BlockAverage | null;
  equilibration: { temperature: EquilibrationCheck; density: EquilibrationCheck | null; equilibrated: boolean };
}

export function degreesOfFreedomFor(nAtoms: number, options: ThermoOptions): number {
  if (options.degreesOfFreedom !== undefined) return options.degreesOfFreedom;
  return 3 * nAtoms - (options.constraints ?? 0) - (options.momentumConserved ?? true ? 3 : 0);
}

export function thermo(traj: Trajectory, options: ThermoOptions = {}, onProgress?: (fraction: number) => void): ThermoResult {
  const N = traj.nAtoms, T = traj.nFrames;
  const masses = Float64Array.from(traj.species, (s) => massOf(s, options.masses));
  const dof = degreesOfFreedomFor(N, options);
  if (!(dof > 0)) throw new Error('Degrees of freedom must be positive.');
  const ke = kineticEnergies(traj, masses, onProgress);
  const eV = JOULE_PER_ENGINE_ENERGY / ELEMENTARY_CHARGE_C;
  const temperatureK = ke.map((k) => (2 * k) / (dof * BOLTZMANN_ENGINE));
  const geom = cellFramesOf(traj) ?? (traj.cells && traj.cells.length === 9 * T ? cellFramesOf({ ...traj, boundary: 'periodic' }) : null);
  let totalMass = 0;
  for (let i = 0; i < N; i++) totalMass += masses[i];
  const densityGPerCm3 = geom ? geom.volumes.map((v) => (totalMass * GRAM_PER_AMU) / (v * CM3_PER_A3)) : null;
  const numberDensityPerA3 = geom ? geom.volumes.map((v) => N / v) : null;
  const tCheck = equilibrationCheck(temperatureK);
  const dCheck = densityGPerCm3 ? equilibrationCheck(densityGPerCm3) : null;
  return {
    units: { time: 'ps', kineticEnergy: 'eV', temperature: 'K', density: 'g/cm³', numberDensity: 'atoms/Å³' },
    timesPs: traj.times,
    degreesOfFreedom: dof,
    velocitySource: traj.velocities ? 'stored-velocities' : 'finite-differences',
    kineticEnergyEV: ke.map((k) => k * eV),
    temperatureK,
    densityGPerCm3,
    numberDensityPerA3,
    temperature: blockAverage(temperatureK),
    density: densityGPerCm3 ? blockAverage(densityGPerCm3) : null,
    equilibration: { temperature: tCheck, density: dCheck, equilibrated: tCheck.equilibrated && (dCheck?.equilibrated ?? true) },
  };
}

/** Kinetic energy per frame in u·Å²/ps². */
export function kineticEnergies(traj: Trajectory, masses: Float64Array, onProgress?: (fraction: number) => void): Float64Array {
  const N = traj.nAtoms, T = traj.nFrames;
  const out = new Float64Array(T);
  const v = traj.velocities;
  if (v) {
    for (let f = 0; f < T; f++) {
      let sum = 0;
      const base = 3 * N * f;
      for (let i = 0; i < N; i++) {
        const p = base + 3 * i;
        sum += masses[i] * (v[p] * v[p] + v[p + 1] * v[p + 1] + v[p + 2] * v[p + 2]);
      }
      out[f] = 0.5 * sum;
      if ((f & 255) === 0) onProgress?.(f / T);
    }
    return out;
  }
  if (T < 2) throw new Error('Temperature without stored velocities needs at least two frames.');
  const dt = frameIntervalPs(traj);
  const geom = cellFramesOf(traj);
  const x = traj.positions;
  const d = new Float64Array(3);
  for (let f = 0; f < T; f++) {
    const a = Math.max(0, f - 1), b = Math.min(T - 1, f + 1);
    const span = (b - a) * dt;
    let sum = 0;
    for (let i = 0; i < N; i++) {
      const pa = 3 * (N * a + i), pb = 3 * (N * b + i);
      d[0] = x[pb] - x[pa];
      d[1] = x[pb + 1] - x[pa + 1];
      d[2] = x[pb + 2] - x[pa + 2];
      if (geom) minimumImage(geom, f, d);
      sum += (masses[i] * (d[0] * d[0] + d[1] * d[1] + d[2] * d[2])) / (span * span);
    }
    out[f] = 0.5 * sum;
  }
  return out;
}

function equilibrationCheck(series: Float64Array): EquilibrationCheck {
  const third = Math.floor(series.length / 3);
  if (third < 2) {
    return { firstThirdMean: NaN, lastThirdMean: NaN, drift: NaN, combinedError: NaN, equilibrated: false };
  }
  const first = blockAverage(series.subarray(0, third));
  const last = blockAverage(series.subarray(series.length - third));
  const drift = last.mean - first.mean;
  const combinedError = Math.hypot(first.stdError, last.stdError);
  return {
    firstThirdMean: first.mean,
    lastThirdMean: last.mean,
    drift,
    combinedError,
    equilibrated: Math.abs(drift) <= EQUILIBRATION_SIGMAS * combinedError,
  };
}
