/**
 * Frames → the engine's Trajectory: flat Float32 arrays in Å, Å/ps and ps.
 * With the counts from inspection the arrays are allocated once at their
 * final size, so peak memory stays about one Float32 copy of the data.
 */
import { handBackArrays, TrajectoryFormatError, type Frame } from './frame.ts';
import type { Trajectory } from '../analysis/trajectory.ts';
import { BlockFileReader, BlockFileWriter, type BlockSizes } from '../out-of-core/block-file.ts';
import {
  LENGTH_TO_ANGSTROM,
  TIME_TO_PS,
  VELOCITY_TO_ANGSTROM_PER_PS,
  type LengthUnit,
  type TimeUnit,
  type VelocityUnit,
} from './units.ts';

export interface AssembleUnits {
  length: LengthUnit;
  time: TimeUnit;
  velocity: VelocityUnit;
  /** Interval between frames in ps, used when the file states no times. */
  timeStepPs?: number;
  /**
   * Defaults to 'periodic' when every frame has a cell and some direction
   * repeats, else 'none'. 'periodic' means periodic along the directions the
   * file marks so (extended XYZ pbc="T T F", the H5MD box boundary), all
   * three where it marks none; 'walls' and 'none' make no direction periodic.
   */
  boundary?: Trajectory['boundary'];
}

export interface AssembleExpected {
  atoms: number;
  frames: number;
}

/** Where coordinates go once they outgrow memory. */
export interface AssembleSpill {
  /** Folder for the scratch file; the caller creates it and removes it after the engine is done. */
  directory: string;
  /** Positions and velocities beyond this many bytes go to the scratch file instead of memory. */
  memoryBytes: number;
  /** Block and chunk sizes other than the scratch file's defaults. */
  sizes?: BlockSizes;
}

/** What helps assembly size its arrays without binding it to anything. */
export interface AssembleHints {
  /**
   * Size in bytes of the text the frames come from. With the byte offsets
   * text readers give their frames, the distance between the first two
   * frames estimates the frame count, so the arrays are allocated once
   * instead of doubling (and being copied) a dozen times.
   */
  inputBytes?: number;
}

/** Room for the frames of a text input, from the first two frames' offsets, with a little slack; 0 when unknown. */
function framesEstimate(inputBytes: number | undefined, first: number | undefined, second: number | undefined): number {
  if (inputBytes === undefined || first === undefined || second === undefined || !(second > first)) return 0;
  return Math.ceil(((inputBytes - first) / (second - first)) * 1.01) + 1;
}

/** An empty marker array, one per use: a trajectory's arrays may be moved to another thread. */
const empty = () => new Float32Array(0);

export async function assembleTrajectory(
  frames: AsyncIterable<Frame> | Iterable<Frame>,
  units: AssembleUnits,
  expected?: AssembleExpected,
  file = 'trajectory',
  spill?: AssembleSpill,
  hints: AssembleHints = {},
): Promise<Trajectory> {
  const lengthFactor = LENGTH_TO_ANGSTROM[units.length];
  const timeFactor = TIME_TO_PS[units.time];
  const velocityFactor = VELOCITY_TO_ANGSTROM_PER_PS[units.velocity];
  if (lengthFactor === undefined || timeFactor === undefined || velocityFactor === undefined) {
    throw new RangeError(`unknown unit in ${JSON.stringify(units)}`);
  }
  if (units.timeStepPs !== undefined && !(units.timeStepPs > 0)) {
    throw new RangeError(`timeStepPs must be positive, got ${units.timeStepPs}`);
  }

  let nAtoms = expected?.atoms ?? -1;
  let capacity = expected?.frames ?? 0;
  let species: string[] = [];
  let lastSpecies: readonly string[] | null = null;
  let positions: Float32Array = empty();
  let velocities: Float32Array | undefined;
  let cells: Float64Array | null = null;
  let times: Float64Array = new Float64Array(capacity);
  let timed: boolean | undefined;
  // Which directions the file marks periodic (every frame must agree); null while it marks none.
  let pbc: [boolean, boolean, boolean] | null = null;
  let count = 0;
  const observables = new Map<string, Float64Array>();
  /** Set once coordinates go to a scratch file; `positions` and `velocities` are then empty markers. */
  let writer: BlockFileWriter | null = null;
  const coordinateBytes = (frameCount: number, withVelocities: boolean) => frameCount * nAtoms * 12 * (withVelocities ? 2 : 1);
  /** Moves the frames held so far into a new scratch file. */
  const startSpilling = (dir: string): BlockFileWriter => {
    const w = new BlockFileWriter(dir, nAtoms, velocities !== undefined, spill?.sizes);
    const n3 = nAtoms * 3;
    for (let k = 0; k < count; k++) {
      w.positions.set(positions.subarray(k * n3, (k + 1) * n3), w.slot());
      if (velocities) w.velocities!.set(velocities.subarray(k * n3, (k + 1) * n3), w.slot());
      w.commit();
    }
    positions = empty();
    if (velocities) velocities = empty();
    return w;
  };

  let firstOffset: number | undefined;
  let boundary: Trajectory['boundary'] = 'none';
  try {
    for await (const frame of frames) {
      const where = { file, frame: frame.index };
      const n = frame.species.length;
      if (count === 0) {
        if (nAtoms >= 0 && n !== nAtoms) {
          throw new TrajectoryFormatError(`frame has ${n} atoms but inspection found ${nAtoms}`, where);
        }
        nAtoms = n;
        firstOffset = (frame as { byteOffset?: number }).byteOffset;
        species = frame.species.slice();
        capacity = expected ? expected.frames : 16;
        times = new Float64Array(capacity);
        if (spill && expected && coordinateBytes(expected.frames, frame.velocities !== undefined) > spill.memoryBytes) {
          if (frame.velocities) velocities = empty();
          writer = startSpilling(spill.directory);
        } else {
          positions = new Float32Array(capacity * n * 3);
          if (frame.velocities) velocities = new Float32Array(capacity * n * 3);
        }
        if (frame.cell) cells = new Float64Array(capacity * 9);
        timed = frame.time !== undefined;
        if (!timed && units.timeStepPs === undefined) {
          throw new TrajectoryFormatError('frames carry no time; a time step (timeStepPs) is needed', where);
        }
      } else if (n !== nAtoms) {
        throw new TrajectoryFormatError(`frame has ${n} atoms but the first frame has ${nAtoms}`, where);
      }
      // Readers hand over the same species array while it does not change, so a full comparison is rare.
      if (frame.species !== lastSpecies) {
        if (count > 0) {
          const atom = species.findIndex((s, k) => s !== frame.species[k]);
          if (atom >= 0) throw new TrajectoryFormatError(`species of atom ${atom + 1} changes from ${species[atom]} to ${frame.species[atom]}; atoms must keep their species and order`, where);
        }
        lastSpecies = frame.species;
      }
      let wanted = count >= capacity ? capacity * 2 : capacity;
      if (count === 1 && !expected) {
        const estimate = framesEstimate(hints.inputBytes, firstOffset, (frame as { byteOffset?: number }).byteOffset);
        // Only while the estimate stays within memory: spilling is decided by the frames actually read.
        if (estimate > wanted && !(spill && coordinateBytes(estimate, velocities !== undefined) > spill.memoryBytes)) wanted = estimate;
      }
      if (wanted > capacity) {
        if (expected) throw new TrajectoryFormatError(`more frames than the ${expected.frames} inspection found`, where);
        capacity = wanted;
        if (!writer && spill && coordinateBytes(capacity, velocities !== undefined) > spill.memoryBytes) writer = startSpilling(spill.directory);
        if (!writer) {
          positions = grow32(positions, capacity * nAtoms * 3);
          if (velocities) velocities = grow32(velocities, capacity * nAtoms * 3);
        }
        if (cells) cells = grow64(cells, capacity * 9);
        times = grow64(times, capacity);
      }
      const base = writer ? writer.slot() : count * nAtoms * 3;
      scaleInto(writer ? writer.positions : positions, base, frame.positions, lengthFactor);
      if (velocities) {
        if (!frame.velocities) throw new TrajectoryFormatError('frame has no velocities but the first frame has', where);
        scaleInto(writer ? writer.velocities! : velocities, base, frame.velocities, velocityFactor);
      }
      // Copied: the reader may refill the frame's arrays rather than leave them to the collector.
      handBackArrays(frame);
      if (cells) {
        if (!frame.cell) throw new TrajectoryFormatError('frame has no cell but the first frame has one', where);
        for (let k = 0; k < 9; k++) cells[count * 9 + k] = frame.cell[k] * lengthFactor;
      }
      if (frame.pbc) {
        if (pbc && frame.pbc.some((p, k) => p !== pbc![k])) {
          throw new TrajectoryFormatError(`periodic directions change from pbc="${pbc.map((p) => (p ? 'T' : 'F')).join(' ')}" to pbc="${frame.pbc.map((p) => (p ? 'T' : 'F')).join(' ')}"`, where);
        }
        pbc = [...frame.pbc];
      }
      if (frame.values) {
        for (const key in frame.values) {
          let series = observables.get(key);
          if (!series) {
            if (observables.size >= 64) continue;
            series = new Float64Array(capacity).fill(NaN);
            observables.set(key, series);
          } else if (series.length < capacity) {
            const filled = series.length;
            series = grow64(series, capacity);
            series.fill(NaN, filled);
            observables.set(key, series);
          }
          series[count] = frame.values[key];
        }
      }
      if (timed) {
        if (frame.time === undefined) throw new TrajectoryFormatError('frame has no time but the first frame has one', where);
        times[count] = frame.time * timeFactor;
      } else {
        times[count] = count * units.timeStepPs!;
      }
      writer?.commit();
      count++;
    }
    if (count === 0) throw new TrajectoryFormatError('no frames to assemble', { file });
    if (expected && count !== expected.frames) {
      throw new TrajectoryFormatError(`found ${count} frames but inspection found ${expected.frames}`, { file });
    }
    const repeats = (pbc ?? [true, true, true]).some(Boolean);
    // A file that marks no direction periodic is open whatever the metadata's default says.
    boundary = units.boundary === 'periodic' && !repeats ? 'none' : units.boundary ?? (cells && repeats ? 'periodic' : 'none');
    if (boundary === 'periodic' && !cells) {
      throw new TrajectoryFormatError('periodic boundary requested but the trajectory has no cell', { file });
    }
  } catch (err) {
    writer?.abandon();
    throw err;
  }
  const trajectory: Trajectory = {
    nAtoms,
    nFrames: count,
    species,
    // A view, not a copy: trimming would briefly hold both.
    positions: writer ? empty() : positions.subarray(0, count * nAtoms * 3),
    cells: cells ? (count === capacity ? cells : cells.slice(0, count * 9)) : null,
    times: count === capacity ? times : times.slice(0, count),
    boundary,
  };
  if (boundary === 'periodic' && pbc && !pbc.every(Boolean)) trajectory.periodicAxes = pbc;
  if (velocities) trajectory.velocities = writer ? empty() : velocities.subarray(0, count * nAtoms * 3);
  if (writer) trajectory.blocks = new BlockFileReader(writer.finish());
  if (observables.size > 0) {
    trajectory.observables = {};
    for (const [key, series] of observables) {
      const full = series.length < count ? grow64(series, count).fill(NaN, series.length) : series;
      trajectory.observables[key] = full.slice(0, count);
    }
  }
  return trajectory;
}

function scaleInto(out: Float32Array, base: number, values: Float32Array | Float64Array, factor: number): void {
  // A plain loop: TypedArray set() between element types converts one element at a time through a slow generic path.
  const n = values.length;
  if (factor === 1) {
    for (let k = 0; k < n; k++) out[base + k] = values[k]!;
    return;
  }
  for (let k = 0; k < n; k++) out[base + k] = values[k]! * factor;
}

function grow32(array: Float32Array, length: number): Float32Array {
  const out = new Float32Array(length);
  out.set(array);
  return out;
}

function grow64(array: Float64Array, length: number): Float64Array {
  const out = new Float64Array(length);
  out.set(array);
  return out;
}
