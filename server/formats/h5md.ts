/**
 * H5MD (HDF5) trajectories through h5wasm, which reads a file on disk.
 * Layout per the H5MD specification: particles/<group>/position/{value,
 * step,time}, optional velocity, box (dimension, boundary, edges fixed or
 * time-dependent, diagonal or full matrix) and species. Position data is
 * read in blocks of frames so a large file is never loaded whole.
 */
import type { Dataset, Group } from 'h5wasm';
import { TrajectoryFormatError, type Cell, type Frame } from './frame.ts';
import type { ResolvedLimits } from './limits.ts';

type H5 = typeof import('h5wasm');
let h5Promise: Promise<H5> | null = null;

async function loadH5(): Promise<H5> {
  h5Promise ??= import('h5wasm/node').then(async (module) => {
    await module.ready;
    return module as unknown as H5;
  });
  return h5Promise;
}

export interface H5mdReadOptions {
  file: string;
  limits: ResolvedLimits;
  /** Frames for which this returns false are not read. */
  wants?: (index: number) => boolean;
  /** First frame to consider. */
  firstIndex?: number;
  /** Bytes of positions (as float64) read per block of frames; default 8 MiB. */
  blockBytes?: number;
}

/** Position blocks are read about this size at a time. */
const BLOCK_BYTES = 8 * 1024 * 1024;

type Numeric = Float32Array | Float64Array;

interface TimeAxis {
  step?: (i: number) => number;
  time?: (i: number) => number;
}

interface Layout {
  root: string;
  frames: number;
  atoms: number;
  position: Dataset;
  velocity?: Dataset;
  axis: TimeAxis;
  species: string[];
  cell: (i: number) => Cell | null;
  pbc?: [boolean, boolean, boolean];
  /** Scalar observables of frame i (energies, pressure…), by lower-case name. */
  values: (i: number) => Record<string, number> | undefined;
}

export async function* readH5md(path: string, options: H5mdReadOptions): AsyncGenerator<Frame> {
  const h5 = await loadH5();
  let handle: InstanceType<H5['File']>;
  try {
    handle = new h5.File(path, 'r');
  } catch (error) {
    throw unreadable(error, options.file);
  }
  try {
    let layout: Layout;
    try {
      layout = describe(h5, handle, options);
    } catch (error) {
      throw error instanceof TrajectoryFormatError ? error : unreadable(error, options.file);
    }
    const { frames, atoms } = layout;
    const valuesPerFrame = atoms * 3;
    // Each block is one hyperslab of whole frames, so memory follows the block, not the file; a strided
    // selection (every n-th frame) is one strided hyperslab per block rather than one read per frame.
    const block = Math.max(1, Math.floor((options.blockBytes ?? BLOCK_BYTES) / (valuesPerFrame * 8)));
    const wants = options.wants ?? (() => true);
    for (let t = options.firstIndex ?? 0; t < frames; ) {
      if (!wants(t)) {
        t++;
        continue;
      }
      const { step: stride, count } = evenRun(t, frames, block, wants);
      const slab: Hyperslab = { from: t, step: stride, count };
      const positions = readBlock(layout.position, slab, valuesPerFrame, options.file);
      const velocities = layout.velocity ? readBlock(layout.velocity, slab, valuesPerFrame, options.file) : undefined;
      for (let k = 0; k < count; k++) {
        const i = t + k * stride;
        const frame: Frame = {
          index: i,
          positions: positions.slice(k * valuesPerFrame, (k + 1) * valuesPerFrame),
          species: layout.species,
          cell: layout.cell(i),
        };
        checkFinite(frame.positions, options.file, i, layout.position.path);
        if (velocities) {
          frame.velocities = velocities.slice(k * valuesPerFrame, (k + 1) * valuesPerFrame);
          checkFinite(frame.velocities, options.file, i, layout.velocity!.path);
        }
        if (layout.pbc) frame.pbc = layout.pbc;
        const time = layout.axis.time?.(i);
        const step = layout.axis.step?.(i);
        if (time !== undefined) frame.time = time;
        if (step !== undefined) frame.step = step;
        const values = layout.values(i);
        if (values) frame.values = values;
        yield frame;
      }
      t += (count - 1) * stride + 1;
    }
  } finally {
    try {
      handle.close();
    } catch {
      // A file that failed to open fully may refuse to close; nothing is held open then.
    }
  }
}

function unreadable(error: unknown, file: string): TrajectoryFormatError {
  const detail = error instanceof Error ? error.message : String(error);
  return new TrajectoryFormatError(`not a readable HDF5 file (${detail})`, { file });
}

function isGroup(entity: unknown, h5: H5): entity is Group {
  return entity instanceof h5.Group;
}

function isDataset(entity: unknown, h5: H5): entity is Dataset {
  return entity instanceof h5.Dataset;
}

function describe(h5: H5, handle: Group, options: H5mdReadOptions): Layout {
  const file = options.file;
  const particles = handle.get('particles');
  if (!isGroup(particles, h5)) {
    throw new TrajectoryFormatError('no particles group: not an H5MD trajectory', { file, path: '/particles' });
  }
  const names = particles.keys();
  const withPosition = names.filter((name) => {
    const group = particles.get(name);
    return isGroup(group, h5) && group.keys().includes('position');
  });
  if (withPosition.length === 0) {
    throw new TrajectoryFormatError('no particle group has a position element', {
      file,
      path: `/particles/${names.length ? `{${names.join(',')}}/` : ''}position`,
    });
  }
  const groupName = withPosition.includes('all') ? 'all' : withPosition[0];
  const root = `/particles/${groupName}`;
  const group = particles.get(groupName) as Group;

  const position = timeSeries(h5, group, 'position', root, file);
  if (!position) throw new TrajectoryFormatError('position element missing', { file, path: `${root}/position` });
  const shape = position.value.shape ?? [];
  if (shape.length !== 3 || shape[2] !== 3) {
    throw new TrajectoryFormatError(`position value must have shape [frames, atoms, 3], found [${shape.join(', ')}]`, {
      file,
      path: position.value.path,
    });
  }
  const [frames, atoms] = shape;
  if (atoms > options.limits.maxAtoms) {
    throw new TrajectoryFormatError(`position claims ${atoms} atoms, more than the limit of ${options.limits.maxAtoms}`, {
      file,
      path: position.value.path,
    });
  }
  if (frames === 0 || atoms === 0) {
    throw new TrajectoryFormatError(`position value is empty (${frames} frames × ${atoms} atoms)`, { file, path: position.value.path });
  }
  checkNumeric(position.value, file);

  let velocity: Dataset | undefined;
  const velocitySeries = timeSeries(h5, group, 'velocity', root, file);
  if (velocitySeries) {
    const vShape = velocitySeries.value.shape ?? [];
    if (vShape.length !== 3 || vShape[0] !== frames || vShape[1] !== atoms || vShape[2] !== 3) {
      throw new TrajectoryFormatError(
        `velocity value has shape [${vShape.join(', ')}] but position has [${shape.join(', ')}]`,
        { file, path: velocitySeries.value.path },
      );
    }
    checkNumeric(velocitySeries.value, file);
    velocity = velocitySeries.value;
  }

  const species = readSpecies(h5, group, root, atoms, file);
  const { cell, pbc } = readBox(h5, group, root, frames, file);
  const values = readObservables(h5, handle, frames, position.axis, file);
  return { root, frames, atoms, position: position.value, velocity, axis: position.axis, species, cell, pbc, values };
}

/**
 * Scalar time series of the H5MD observables group (/observables/<name> or
 * /observables/<group>/<name>, each {value, step?, time?}). A series is
 * matched to position frames by index when the counts agree, else by step
 * number; one that matches neither way is left out.
 */
function readObservables(h5: H5, handle: Group, frames: number, axis: TimeAxis, file: string): (i: number) => Record<string, number> | undefined {
  if (!handle.keys().includes('observables')) return () => undefined;
  const top = handle.get('observables');
  if (!isGroup(top, h5)) return () => undefined;
  const series = new Map<string, Float64Array>();
  const visit = (group: Group, prefix: string, depth: number): void => {
    for (const name of group.keys()) {
      if (series.size >= 64) return;
      const element = group.get(name);
      const key = `${prefix}${name}`.toLowerCase();
      if (!isGroup(element, h5)) continue;
      if (!element.keys().includes('value')) {
        if (depth === 0) visit(element, `${name}/`, 1);
        continue;
      }
      const value = element.get('value');
      if (!isDataset(value, h5)) continue;
      const shape = value.shape ?? [];
      if (!(shape.length === 1 || (shape.length === 2 && shape[1] === 1))) continue;
      const path = `/observables/${prefix}${name}/value`;
      checkNumeric(value, file);
      const data = numbersOf(value.value, path, file);
      const n = data.length;
      if (n === frames) {
        series.set(key, data);
        continue;
      }
      const own = axisOf(h5, element, 'step', n, `/observables/${prefix}${name}`, file);
      if (!own || !axis.step) continue;
      const byStep = new Map<number, number>();
      for (let k = 0; k < n; k++) byStep.set(own(k), data[k]);
      series.set(key, Float64Array.from({ length: frames }, (_, i) => byStep.get(axis.step!(i)) ?? NaN));
    }
  };
  visit(top, '', 0);
  if (series.size === 0) return () => undefined;
  return (i) => {
    const out: Record<string, number> = {};
    let any = false;
    for (const [key, data] of series) {
      if (Number.isFinite(data[i])) {
        out[key] = data[i];
        any = true;
      }
    }
    return any ? out : undefined;
  };
}

/**
 * An H5MD element: either a time-dependent group {value, step, time} or a
 * fixed dataset (one frame, no time axis).
 */
function timeSeries(
  h5: H5,
  group: Group,
  name: string,
  root: string,
  file: string,
): { value: Dataset; axis: TimeAxis } | null {
  if (!group.keys().includes(name)) return null;
  const element = group.get(name);
  if (isDataset(element, h5)) return { value: element, axis: {} };
  if (!isGroup(element, h5)) return null;
  const value = element.get('value');
  if (!isDataset(value, h5)) {
    throw new TrajectoryFormatError(`${name} group has no value dataset`, { file, path: `${root}/${name}/value` });
  }
  const frames = value.shape?.[0] ?? 0;
  return {
    value,
    axis: {
      step: axisOf(h5, element, 'step', frames, `${root}/${name}`, file),
      time: axisOf(h5, element, 'time', frames, `${root}/${name}`, file),
    },
  };
}

/** step/time as an array per frame, or a scalar interval with an optional offset attribute (H5MD fixed sampling). */
function axisOf(h5: H5, element: Group, name: string, frames: number, base: string, file: string): ((i: number) => number) | undefined {
  if (!element.keys().includes(name)) return undefined;
  const dataset = element.get(name);
  const path = `${base}/${name}`;
  if (!isDataset(dataset, h5)) return undefined;
  const shape = dataset.shape ?? [];
  if (shape.length === 0) {
    const interval = toNumber(dataset.value);
    const offsetAttribute = dataset.attrs['offset'];
    const offset = offsetAttribute ? toNumber(offsetAttribute.value) : 0;
    if (!Number.isFinite(interval) || !Number.isFinite(offset)) {
      throw new TrajectoryFormatError(`${name} is not a finite number`, { file, path });
    }
    return (i) => offset + i * interval;
  }
  if (shape.length !== 1 || shape[0] !== frames) {
    throw new TrajectoryFormatError(`${name} has shape [${shape.join(', ')}] but there are ${frames} frames`, { file, path });
  }
  const values = Array.from(numbersOf(dataset.value, path, file));
  const bad = values.findIndex((v) => !Number.isFinite(v));
  if (bad >= 0) throw new TrajectoryFormatError(`${name} of frame ${bad + 1} is not a finite number`, { file, path, frame: bad });
  return (i) => values[i];
}

function readSpecies(h5: H5, group: Group, root: string, atoms: number, file: string): string[] {
  if (!group.keys().includes('species')) return new Array<string>(atoms).fill('X');
  const element = group.get('species');
  let dataset: Dataset | null = null;
  let owner: Group | Dataset | null = null;
  if (isDataset(element, h5)) {
    dataset = element;
    owner = element;
  } else if (isGroup(element, h5) && isDataset(element.get('value'), h5)) {
    dataset = element.get('value') as Dataset;
    owner = element;
  }
  const path = `${root}/species`;
  if (!dataset || !owner) throw new TrajectoryFormatError('species is neither a dataset nor a group with a value', { file, path });
  const shape = dataset.shape ?? [];
  const perFrame = shape.length === 2;
  if (!(shape.length === 1 || perFrame) || shape[shape.length - 1] !== atoms) {
    throw new TrajectoryFormatError(`species has shape [${shape.join(', ')}] but there are ${atoms} atoms`, { file, path: dataset.path });
  }
  const raw = perFrame ? dataset.slice([[0, 1]]) : dataset.value;
  if (Array.isArray(raw) && raw.every((v) => typeof v === 'string')) return raw as string[];
  const codes = Array.from(numbersOf(raw, dataset.path, file));
  const mapping = speciesMapping(owner);
  return codes.map((code) => mapping.get(code) ?? String(code));
}

/**
 * H5MD stores species as integer codes and leaves their meaning to the
 * writer; a names list (optionally with matching codes) as an attribute of
 * the species element is honoured when present.
 */
function speciesMapping(owner: Group | Dataset): Map<number, string> {
  const attributes = owner.attrs;
  const namesAttribute = attributes['names'] ?? attributes['labels'] ?? attributes['elements'];
  const out = new Map<number, string>();
  if (!namesAttribute) return out;
  const names = namesAttribute.json_value;
  if (!Array.isArray(names)) return out;
  const codesAttribute = attributes['codes'];
  const codes = codesAttribute ? codesAttribute.json_value : null;
  names.forEach((name, k) => {
    const code = Array.isArray(codes) ? Number(codes[k]) : k;
    if (typeof name === 'string') out.set(code, name);
  });
  return out;
}

function readBox(
  h5: H5,
  group: Group,
  root: string,
  frames: number,
  file: string,
): { cell: (i: number) => Cell | null; pbc?: [boolean, boolean, boolean] } {
  const none = { cell: () => null };
  if (!group.keys().includes('box')) return none;
  const box = group.get('box');
  const path = `${root}/box`;
  if (!isGroup(box, h5)) throw new TrajectoryFormatError('box is not a group', { file, path });
  const boundaryAttribute = box.attrs['boundary'];
  let pbc: [boolean, boolean, boolean] | undefined;
  if (boundaryAttribute) {
    const boundary = boundaryAttribute.json_value;
    const list = Array.isArray(boundary) ? boundary : [boundary];
    if (list.length !== 3) {
      throw new TrajectoryFormatError(`box boundary must name 3 directions, found ${list.length}`, { file, path });
    }
    pbc = list.map((b) => String(b).toLowerCase() === 'periodic') as [boolean, boolean, boolean];
  }
  const dimensionAttribute = box.attrs['dimension'];
  if (dimensionAttribute && toNumber(dimensionAttribute.value) !== 3) {
    throw new TrajectoryFormatError(`box dimension is ${String(dimensionAttribute.json_value)}; only 3-D trajectories are supported`, {
      file,
      path,
    });
  }
  if (!box.keys().includes('edges')) {
    if (pbc?.some(Boolean)) throw new TrajectoryFormatError('box is periodic but has no edges', { file, path: `${path}/edges` });
    return { ...none, pbc };
  }
  const edges = box.get('edges');
  if (isDataset(edges, h5)) {
    const cell = cellFromEdges(numbersOf(edges.value, edges.path, file), edges.shape ?? [], edges.path, file);
    return { cell: () => cell, pbc };
  }
  const value = isGroup(edges, h5) ? edges.get('value') : null;
  if (!isDataset(value, h5)) throw new TrajectoryFormatError('box edges has no value dataset', { file, path: `${path}/edges/value` });
  const shape = value.shape ?? [];
  if (shape[0] !== frames) {
    throw new TrajectoryFormatError(`box edges have ${shape[0]} frames but position has ${frames}`, { file, path: value.path });
  }
  const all = numbersOf(value.value, value.path, file);
  const per = all.length / frames;
  const cells = Array.from({ length: frames }, (_, i) =>
    cellFromEdges(all.subarray(i * per, (i + 1) * per), shape.slice(1), value.path, file, i),
  );
  return { cell: (i) => cells[i], pbc };
}

/** H5MD edges: a vector of 3 lengths (rectangular box) or a 3×3 matrix of edge vectors as rows. */
function cellFromEdges(values: Float64Array, shape: number[], path: string, file: string, frame?: number): Cell {
  let cell: Float64Array;
  if (shape.length === 1 && shape[0] === 3) {
    cell = Float64Array.from([values[0], 0, 0, 0, values[1], 0, 0, 0, values[2]]);
  } else if (shape.length === 2 && shape[0] === 3 && shape[1] === 3) {
    cell = Float64Array.from(values);
  } else {
    throw new TrajectoryFormatError(`box edges must have shape [3] or [3, 3], found [${shape.join(', ')}]`, { file, path, frame });
  }
  if (cell.some((v) => !Number.isFinite(v))) throw new TrajectoryFormatError('box edges are not finite numbers', { file, path, frame });
  return cell;
}

/** Frames from, from + step, … (count of them) of a dataset whose first axis is the frame. */
interface Hyperslab {
  from: number;
  step: number;
  count: number;
}

/** A gap between wanted frames longer than this is not looked for: such frames are read one at a time. */
const MAX_STEP = 65_536;

/**
 * The wanted frames from `t` (itself wanted) on at one even step with none
 * wanted in between, at most `block` of them: what one strided hyperslab
 * reads. Contiguous frames are the step-1 case.
 */
function evenRun(t: number, frames: number, block: number, wants: (i: number) => boolean): { step: number; count: number } {
  let next = t + 1;
  const limit = Math.min(frames, t + MAX_STEP + 1);
  while (next < limit && !wants(next)) next++;
  if (block < 2 || next >= limit) return { step: 1, count: 1 };
  const step = next - t;
  let count = 2;
  for (let last = next; count < block; count++, last += step) {
    const after = last + step;
    if (after >= frames || !wants(after)) break;
    let between = last + 1;
    while (between < after && !wants(between)) between++;
    if (between < after) break;
  }
  return { step, count };
}

function readBlock(dataset: Dataset, slab: Hyperslab, valuesPerFrame: number, file: string): Numeric {
  const end = slab.from + (slab.count - 1) * slab.step + 1;
  const data = dataset.slice([slab.step === 1 ? [slab.from, end] : [slab.from, end, slab.step]]);
  if (data instanceof Float32Array || data instanceof Float64Array) return checkedLength(data, slab, valuesPerFrame, dataset, file);
  return checkedLength(numbersOf(data, dataset.path, file), slab, valuesPerFrame, dataset, file);
}

function checkedLength(data: Numeric, slab: Hyperslab, valuesPerFrame: number, dataset: Dataset, file: string): Numeric {
  if (data.length !== slab.count * valuesPerFrame) {
    throw new TrajectoryFormatError('dataset returned an unexpected number of values', { file, path: dataset.path });
  }
  return data;
}

function checkNumeric(dataset: Dataset, file: string): void {
  const dtype = dataset.dtype;
  if (typeof dtype !== 'string' || !/^[<>|=!]?[bBhHiIlLqQefd]$/.test(dtype)) {
    throw new TrajectoryFormatError(`dataset holds ${JSON.stringify(dtype)}, not numbers`, { file, path: dataset.path });
  }
}

function checkFinite(values: Numeric, file: string, frame: number, path: string): void {
  for (let k = 0; k < values.length; k++) {
    const v = values[k];
    if (v - v !== 0) {
      throw new TrajectoryFormatError(`atom ${Math.floor(k / 3) + 1} has a non-finite value (${v})`, { file, frame, path });
    }
  }
}

function numbersOf(data: unknown, path: string, file: string): Float64Array {
  if (data instanceof Float64Array) return data;
  if (ArrayBuffer.isView(data) && !(data instanceof DataView)) {
    const view = data as unknown as ArrayLike<number | bigint>;
    const out = new Float64Array(view.length);
    for (let k = 0; k < view.length; k++) out[k] = Number(view[k]);
    return out;
  }
  if (typeof data === 'number' || typeof data === 'bigint') return Float64Array.of(Number(data));
  if (Array.isArray(data) && data.every((v) => typeof v === 'number' || typeof v === 'bigint')) {
    return Float64Array.from(data as (number | bigint)[], Number);
  }
  throw new TrajectoryFormatError('dataset does not hold numbers', { file, path });
}

function toNumber(data: unknown): number {
  if (typeof data === 'number') return data;
  if (typeof data === 'bigint') return Number(data);
  if (ArrayBuffer.isView(data) && !(data instanceof DataView)) return Number((data as unknown as ArrayLike<number>)[0]);
  if (Array.isArray(data) && data.length === 1) return toNumber(data[0]);
  return NaN;
}
