/**
 * Kinetic energy and temperature per frame by equipartition,
 * T = 2·KE/(N_dof·k_B), and density per frame, with block-averaged means.
 * N_dof follows the one rule of degrees-of-freedom.ts (3N − constraints − 3
 * with the centre-of-mass motion removed); with COM drift removal on, each
 * frame's COM kinetic energy is taken out before dividing by N_dof. A stated
 * temperature is compared with the kinetic one (temperature-choice.ts).
 *
 * Without stored velocities, velocities are central differences of
 * positions on the interior frames, which read each mode's kinetic energy
 * low by [sin(ωΔt)/(ωΔt)]² (SCIENCE item 24). The series is scaled by the
 * ratio of the corrected to the raw velocity spectrum of the same run (see
 * vdos.ts), so its mean is the kinetic temperature of the corrected spectrum.
 *
 * Equilibration flag: the means of the first and last thirds (each with its
 * own blocking error) must agree within EQUILIBRATION_SIGMAS combined errors.
 * When they do not, the temperature series is handed to the automated
 * equilibration detection (Chodera, J. Chem. Theory Comput. 12, 1799 (2016);
 * run-plan/equilibration-start.ts), and the time it settles after is
 * suggested as a discard for the next run.
 */
import { massOf } from '../../shared/elements.ts';
import { blockAverage, type BlockAverage } from './block-average.ts';
import { degreesOfFreedom } from './degrees-of-freedom.ts';
import { statedTemperatureWarning } from './temperature-choice.ts';
import { axesText, cellFramesOf, minimumImage } from './cell-geometry.ts';
import { FrameCursor } from './coordinate-blocks.ts';
import { BOLTZMANN_ENGINE, GRAM_PER_AMU, CM3_PER_A3, JOULE_PER_ENGINE_ENERGY, ELEMENTARY_CHARGE_C } from './constants.ts';
import { frameIntervalPs } from './frame-timing.ts';
import type { Trajectory } from './trajectory.ts';
import { vdos } from './vdos.ts';
import { equilibrationStart } from '../run-plan/equilibration-start.ts';

export const EQUILIBRATION_SIGMAS = 3;

export interface ThermoOptions {
  /** Total degrees of freedom; overrides the default 3N − 3 − constraints. */
  degreesOfFreedom?: number;
  /** Holonomic constraints (e.g. 3 per rigid water). */
  constraints?: number;
  /** Remove each frame's centre-of-mass motion, which subtracts 3 degrees of freedom (default true). */
  removeComDrift?: boolean;
  masses?: Readonly<Record<string, number>>;
  /** Temperature the simulation states, K, compared with the kinetic one. */
  statedTemperatureK?: number | null;
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
  /** How the degrees of freedom were counted, in words. */
  degreesOfFreedomRule: string;
  statedTemperatureK: number | null;
  velocitySource: 'stored-velocities' | 'central-differences';
  /** Factor the finite-difference kinetic energy was scaled by (1 with stored velocities). */
  differenceCorrection: number;
  /** Things a reader must not miss (coarse sampling). */
  warnings: string[];
  kineticEnergyEV: Float64Array;
  temperatureK: Float64Array;
  /** Null without a periodic cell. */
  densityGPerCm3: Float64Array | null;
  numberDensityPerA3: Float64Array | null;
  temperature: BlockAverage;
  density: BlockAverage | null;
  equilibration: { temperature: EquilibrationCheck; density: EquilibrationCheck | null; equilibrated: boolean; settlesAfter: SettlesAfter | null };
}

/** Where the analysed temperature series stops relaxing, counted from the first frame analysed. */
export interface SettlesAfter {
  /** Frames of the analysed series (after any stride) to leave out. */
  frames: number;
  /** The same, as time from the first analysed frame, ps. */
  ps: number;
}

export function degreesOfFreedomFor(nAtoms: number, options: ThermoOptions): number {
  return degreesOfFreedom({ nAtoms, removeComDrift: options.removeComDrift ?? true, constraints: options.constraints, degreesOfFreedom: options.degreesOfFreedom }).total;
}

export function thermo(traj: Trajectory, options: ThermoOptions = {}, onProgress?: (fraction: number) => void): ThermoResult {
  const N = traj.nAtoms;
  const masses = Float64Array.from(traj.species, (s) => massOf(s, options.masses));
  const removeCom = options.removeComDrift ?? true;
  const counted = degreesOfFreedom({ nAtoms: N, removeComDrift: removeCom, constraints: options.constraints, degreesOfFreedom: options.degreesOfFreedom });
  const dof = counted.total;
  const { frames, kinetic } = frameKineticEnergies(traj, masses, removeCom, onProgress);
  const warnings: string[] = [];
  let correction = 1;
  if (!traj.velocities) {
    if (traj.nFrames >= 4) {
      const spectral = vdos(traj, { masses: options.masses, removeComDrift: removeCom, degreesOfFreedom: dof });
      correction = spectral.differenceCorrection?.correctedOverRaw ?? 1;
      warnings.push(...spectral.warnings);
    } else {
      warnings.push('Too few frames to correct the finite-difference velocities: the temperature reads low.');
    }
  }
  const eV = JOULE_PER_ENGINE_ENERGY / ELEMENTARY_CHARGE_C;
  const ke = kinetic.map((k) => k * correction);
  const temperatureK = ke.map((k) => (2 * k) / (dof * BOLTZMANN_ENGINE));
  const cellGeom = cellFramesOf(traj) ?? (traj.cells && traj.cells.length === 9 * traj.nFrames ? cellFramesOf({ ...traj, boundary: 'periodic', periodicAxes: undefined }) : null);
  // A slab's cell holds vacuum or walls along its normal: the cell volume is not the volume the atoms fill.
  const geom = cellGeom?.partlyPeriodic ? null : cellGeom;
  if (cellGeom?.partlyPeriodic) warnings.push(`No density: the system is periodic along ${axesText(cellGeom.periodic)} only, so the cell's volume is not the volume its atoms fill.`);
  let totalMass = 0;
  for (let i = 0; i < N; i++) totalMass += masses[i];
  const densityGPerCm3 = geom ? Float64Array.from(frames, (f) => (totalMass * GRAM_PER_AMU) / (geom.volumes[f] * CM3_PER_A3)) : null;
  const numberDensityPerA3 = geom ? Float64Array.from(frames, (f) => N / geom.volumes[f]) : null;
  const temperature = blockAverage(temperatureK);
  const stated = statedTemperatureWarning(temperature.mean, options.statedTemperatureK);
  if (stated) warnings.push(stated);
  const tCheck = equilibrationCheck(temperatureK);
  const dCheck = densityGPerCm3 ? equilibrationCheck(densityGPerCm3) : null;
  const equilibrated = tCheck.equilibrated && (dCheck?.equilibrated ?? true);
  const timesPs = Float64Array.from(frames, (f) => traj.times[f]);
  return {
    units: { time: 'ps', kineticEnergy: 'eV', temperature: 'K', density: 'g/cm³', numberDensity: 'atoms/Å³' },
    timesPs,
    degreesOfFreedom: dof,
    degreesOfFreedomRule: counted.rule,
    statedTemperatureK: options.statedTemperatureK ?? null,
    velocitySource: traj.velocities ? 'stored-velocities' : 'central-differences',
    differenceCorrection: correction,
    warnings,
    kineticEnergyEV: ke.map((k) => k * eV),
    temperatureK,
    densityGPerCm3,
    numberDensityPerA3,
    temperature,
    density: densityGPerCm3 ? blockAverage(densityGPerCm3) : null,
    equilibration: { temperature: tCheck, density: dCheck, equilibrated, settlesAfter: equilibrated ? null : settlesAfter(temperatureK, frames, traj.times) },
  };
}

/** The start the temperature series settles after, or null when it is too short to judge or settled from the start. */
function settlesAfter(temperatureK: Float64Array, frames: Int32Array, times: Float64Array): SettlesAfter | null {
  const start = equilibrationStart(temperatureK);
  if (!start || start.frame === 0) return null;
  // Without velocities the series starts at the second frame: the count is of the trajectory's frames.
  const frame = frames[start.frame]!;
  return { frames: frame, ps: times[frame]! - times[0]! };
}

/**
 * Kinetic energy per frame in u·Å²/ps², from stored velocities (every frame)
 * or central differences of minimum-image positions (interior frames), with
 * the centre-of-mass kinetic energy ½M·V² of each frame taken out if asked.
 */
export function frameKineticEnergies(traj: Trajectory, masses: Float64Array, removeCom: boolean, onProgress?: (fraction: number) => void): { frames: Int32Array; kinetic: Float64Array } {
  const N = traj.nAtoms, T = traj.nFrames;
  const v = traj.velocities;
  if (!v && T < 3) throw new Error('Temperature without stored velocities needs at least three frames.');
  const frames = v ? Int32Array.from({ length: T }, (_, f) => f) : Int32Array.from({ length: T - 2 }, (_, f) => f + 1);
  const dt = v ? 0 : frameIntervalPs(traj);
  const geom = v ? null : cellFramesOf(traj);
  const cursor = new FrameCursor(traj, v ? 'velocities' : 'positions');
  const step = new Float64Array(3), vel = new Float64Array(3);
  let totalMass = 0;
  for (let i = 0; i < N; i++) totalMass += masses[i];
  const kinetic = new Float64Array(frames.length);
  frames.forEach((f, k) => {
    let sum = 0, px = 0, py = 0, pz = 0;
    // Frame by frame (a block at a time when the coordinates are not in memory).
    const here = cursor.frame(f);
    const before = v ? here : cursor.frame(f - 1), after = v ? here : cursor.frame(f + 1);
    for (let i = 0; i < N; i++) {
      if (v) {
        const p = here.offset + 3 * i, data = here.data;
        vel[0] = data[p], vel[1] = data[p + 1], vel[2] = data[p + 2];
      } else {
        vel.fill(0);
        for (const [a, b, fb] of [[before, here, f], [here, after, f + 1]] as const) {
          const pa = a.offset + 3 * i, pb = b.offset + 3 * i, xa = a.data, xb = b.data;
          step[0] = xb[pb] - xa[pa], step[1] = xb[pb + 1] - xa[pa + 1], step[2] = xb[pb + 2] - xa[pa + 2];
          if (geom) minimumImage(geom, fb, step);
          for (let c = 0; c < 3; c++) vel[c] += step[c] / (2 * dt);
        }
      }
      const m = masses[i];
      sum += m * (vel[0] * vel[0] + vel[1] * vel[1] + vel[2] * vel[2]);
      px += m * vel[0], py += m * vel[1], pz += m * vel[2];
    }
    kinetic[k] = 0.5 * sum - (removeCom ? (0.5 * (px * px + py * py + pz * pz)) / totalMass : 0);
    if ((k & 255) === 0) onProgress?.(k / frames.length);
  });
  return { frames, kinetic };
}

/**
 * Kinetic energy of every frame in u·Å²/ps², COM motion included: from stored
 * velocities, or from differences of minimum-image positions (central for
 * interior frames, one-sided at the two ends) without any spectral correction.
 */
export function kineticEnergies(traj: Trajectory, masses: Float64Array, onProgress?: (fraction: number) => void): Float64Array {
  if (traj.velocities) return frameKineticEnergies(traj, masses, false, onProgress).kinetic;
  const N = traj.nAtoms, T = traj.nFrames;
  if (T < 2) throw new Error('Temperature without stored velocities needs at least two frames.');
  const out = new Float64Array(T);
  const dt = frameIntervalPs(traj);
  const geom = cellFramesOf(traj);
  const cursor = new FrameCursor(traj, 'positions');
  const d = new Float64Array(3);
  for (let f = 0; f < T; f++) {
    const a = Math.max(0, f - 1), b = Math.min(T - 1, f + 1);
    const span = (b - a) * dt;
    const { data: xa, offset: oa } = cursor.frame(a), { data: xb, offset: ob } = cursor.frame(b);
    let sum = 0;
    for (let i = 0; i < N; i++) {
      const pa = oa + 3 * i, pb = ob + 3 * i;
      d[0] = xb[pb] - xa[pa];
      d[1] = xb[pb + 1] - xa[pa + 1];
      d[2] = xb[pb + 2] - xa[pa + 2];
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
