/**
 * Test fixtures built in code: a small deterministic system and writers
 * for each format that are independent of the product's own writer, so
 * reading them checks the readers against the format descriptions.
 */
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { zipSync } from 'fflate';
import { openTrajectory, type OpenOptions } from '../../../server/formats/open-trajectory.ts';
import type { Frame } from '../../../server/formats/frame.ts';

export interface System {
  species: string[];
  /** [frame][atom*3], values with 3 decimals so every format holds them exactly. */
  positions: Float64Array[];
  velocities: Float64Array[];
  /** Lattice vector rows per frame. */
  cells: Float64Array[];
  times: number[];
}

/** Deterministic LCG so failures reproduce. */
export function random(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return state / 2 ** 32;
  };
}

const round3 = (x: number) => Math.round(x * 1000) / 1000;

export function makeSystem(atoms: number, frames: number, seed = 7, options: { cellChanges?: boolean } = {}): System {
  const rnd = random(seed);
  const pool = ['O', 'H', 'H', 'Na', 'Cl'];
  const species = Array.from({ length: atoms }, (_, a) => pool[a % pool.length]);
  const positions: Float64Array[] = [];
  const velocities: Float64Array[] = [];
  const cells: Float64Array[] = [];
  const times: number[] = [];
  for (let f = 0; f < frames; f++) {
    positions.push(Float64Array.from({ length: 3 * atoms }, () => round3(rnd() * 40 - 10)));
    velocities.push(Float64Array.from({ length: 3 * atoms }, () => round3(rnd() * 2 - 1)));
    const edge = options.cellChanges ? round3(20 + f * 0.125) : 20;
    cells.push(Float64Array.from([edge, 0, 0, 0, 21.5, 0, 0, 0, 23.25]));
    times.push(round3(f * 0.5));
  }
  return { species, positions, velocities, cells, times };
}

const f3 = (x: number) => x.toFixed(3);

export function xyzText(system: System, newline = '\n'): string {
  let out = '';
  system.positions.forEach((pos, f) => {
    out += `${system.species.length}${newline}frame ${f} of a test system${newline}`;
    system.species.forEach((s, a) => {
      out += `${s} ${f3(pos[3 * a])} ${f3(pos[3 * a + 1])} ${f3(pos[3 * a + 2])}${newline}`;
    });
  });
  return out;
}

/** Extended XYZ with a chosen column order; columns not named pos/species/velo are filler. */
export function extxyzText(
  system: System,
  order: string[] = ['species', 'pos', 'velo'],
  options: { newline?: string; separator?: string; velocityName?: string; quoteLattice?: boolean } = {},
): string {
  const nl = options.newline ?? '\n';
  const sep = options.separator ?? ' ';
  const velocityName = options.velocityName ?? 'velo';
  const spec: Record<string, string> = {
    species: 'species:S:1',
    pos: 'pos:R:3',
    velo: `${velocityName}:R:3`,
    charge: 'charge:R:1',
    id: 'id:I:1',
    mask: 'mask:L:1',
    forces: 'forces:R:3',
  };
  let out = '';
  system.positions.forEach((pos, f) => {
    const vel = system.velocities[f];
    const cell = Array.from(system.cells[f]).join(' ');
    const lattice = options.quoteLattice === false ? `Lattice={${cell}}` : `Lattice="${cell}"`;
    out += `${system.species.length}${nl}${lattice} Properties=${order.map((c) => spec[c]).join(':')} Time=${system.times[f]} energy=-1.5 pbc="T T T"${nl}`;
    system.species.forEach((s, a) => {
      const cols = order.map((c) => {
        switch (c) {
          case 'species':
            return s;
          case 'pos':
            return [0, 1, 2].map((k) => f3(pos[3 * a + k])).join(sep);
          case 'velo':
            return [0, 1, 2].map((k) => f3(vel[3 * a + k])).join(sep);
          case 'charge':
            return '0.25';
          case 'id':
            return String(a + 1);
          case 'mask':
            return 'T';
          default:
            return '1.0 2.0 3.0';
        }
      });
      out += `${cols.join(sep)}${nl}`;
    });
  });
  return out;
}

/** PDB with fixed columns per the wwPDB description: one MODEL per frame, CRYST1 per model. */
export function pdbText(system: System, options: { elementColumns?: boolean } = {}): string {
  const lines: string[] = ['REMARK   test system'];
  system.positions.forEach((pos, f) => {
    const cell = system.cells[f];
    lines.push(`CRYST1${cell[0].toFixed(3).padStart(9)}${cell[4].toFixed(3).padStart(9)}${cell[8].toFixed(3).padStart(9)}${'90.00'.padStart(7)}${'90.00'.padStart(7)}${'90.00'.padStart(7)} P 1           1`);
    lines.push(`MODEL     ${String(f + 1).padStart(4)}`);
    system.species.forEach((s, a) => {
      const name = (s.length === 1 ? ` ${s}` : s.toUpperCase()).padEnd(4);
      const element = options.elementColumns === false ? '  ' : s.toUpperCase().padStart(2);
      const line =
        'ATOM  ' +
        String(a + 1).padStart(5) +
        ' ' +
        name +
        ' ' +
        'MOL' +
        ' ' +
        'A' +
        String(1).padStart(4) +
        '    ' +
        f3(pos[3 * a]).padStart(8) +
        f3(pos[3 * a + 1]).padStart(8) +
        f3(pos[3 * a + 2]).padStart(8) +
        '1.00'.padStart(6) +
        '0.00'.padStart(6) +
        '          ' +
        element;
      lines.push(line);
    });
    lines.push('ENDMDL');
  });
  lines.push('END');
  return `${lines.join('\n')}\n`;
}

export interface TempDir {
  path: string;
  file(name: string): string;
  remove(): Promise<void>;
}

export async function tempDir(): Promise<TempDir> {
  const path = await mkdtemp(join(tmpdir(), 'ergodic-formats-test-'));
  return { path, file: (name) => join(path, name), remove: () => rm(path, { recursive: true, force: true }) };
}

type H5 = typeof import('h5wasm');
export async function h5(): Promise<H5> {
  const module = await import('h5wasm/node');
  await module.ready;
  return module as unknown as H5;
}

/** H5MD with time-dependent position/velocity/box and integer species with a names attribute. */
export async function writeH5md(path: string, system: System, options: { timeDependentBox?: boolean } = {}): Promise<void> {
  const { File } = await h5();
  const file = new File(path, 'w');
  const frames = system.positions.length;
  const atoms = system.species.length;
  const h5md = file.create_group('h5md');
  h5md.create_attribute('version', new Int32Array([1, 1]));
  const particles = file.create_group('particles');
  const all = particles.create_group('all');
  const flat = (arrays: Float64Array[]) => {
    const out = new Float64Array(arrays.length * arrays[0].length);
    arrays.forEach((a, k) => out.set(a, k * a.length));
    return out;
  };
  const series = (name: string, data: Float64Array[]) => {
    const group = all.create_group(name);
    group.create_dataset({ name: 'value', data: flat(data), shape: [frames, atoms, 3] });
    group.create_dataset({ name: 'step', data: Int32Array.from(system.times, (_, k) => k * 10) });
    group.create_dataset({ name: 'time', data: Float64Array.from(system.times) });
  };
  series('position', system.positions);
  series('velocity', system.velocities);
  const box = all.create_group('box');
  box.create_attribute('dimension', 3);
  box.create_attribute('boundary', ['periodic', 'periodic', 'periodic']);
  if (options.timeDependentBox) {
    const edges = box.create_group('edges');
    edges.create_dataset({ name: 'value', data: flat(system.cells), shape: [frames, 3, 3] });
    edges.create_dataset({ name: 'step', data: Int32Array.from(system.times, (_, k) => k * 10) });
  } else {
    const c = system.cells[0];
    box.create_dataset({ name: 'edges', data: Float64Array.from([c[0], c[4], c[8]]) });
  }
  const names = Array.from(new Set(system.species));
  const species = all.create_dataset({ name: 'species', data: Int32Array.from(system.species, (s) => names.indexOf(s)) });
  species.create_attribute('names', names);
  file.close();
}

/** Splits bytes into uneven chunks so parsers meet lines cut at every position. */
export async function* chunked(bytes: Uint8Array, sizes: number[] = [1, 7, 64, 4093]): AsyncGenerator<Uint8Array> {
  let at = 0;
  let k = 0;
  while (at < bytes.length) {
    const size = sizes[k++ % sizes.length];
    yield bytes.subarray(at, at + size);
    at += size;
  }
}

export async function readAll(
  source: string | Uint8Array | AsyncIterable<Uint8Array>,
  name: string,
  options: OpenOptions = {},
): Promise<Frame[]> {
  const input = typeof source === 'string' ? source : source instanceof Uint8Array ? chunked(source, [65536]) : source;
  const opened = await openTrajectory(input, name, options);
  const frames: Frame[] = [];
  for await (const frame of opened.frames) frames.push(frame);
  return frames;
}

/** The message a failing read gives; fails the test when the read succeeds. */
export async function failure(run: () => Promise<unknown>): Promise<string> {
  try {
    await run();
  } catch (error) {
    return (error as Error).message;
  }
  throw new Error('expected the read to fail, but it succeeded');
}

export const bytes = (text: string) => Buffer.from(text, 'utf8');
export const gzip = (data: Uint8Array) => gzipSync(data);
export const zip = (entries: Record<string, Uint8Array>) => Buffer.from(zipSync(entries));
