/**
 * Trajectories built with a known answer, of the kinds a practitioner
 * uploads: mixtures, boxes of molecules, jittered crystals of several sizes,
 * ideal gases. Each builder says what the right answer is.
 */
import type { Trajectory } from '../../../server/analysis/trajectory.ts';
import { fccLattice } from '../../../server/simulate/fcc-lattice.ts';
import { simulateHarmonicDiatomics, type HarmonicDiatomicsOptions } from '../../../server/simulate/harmonic-diatomics.ts';
import { SeededRandom } from '../../../server/simulate/random.ts';
import { cubicCells } from './synthetic.ts';

/** Atoms of several trajectories with the same frames side by side in one (same cell, same times). */
export function combine(parts: Trajectory[]): Trajectory {
  const first = parts[0];
  const T = first.nFrames;
  const N = parts.reduce((s, p) => s + p.nAtoms, 0);
  const positions = new Float32Array(3 * N * T);
  const hasV = parts.every((p) => p.velocities);
  const velocities = hasV ? new Float32Array(3 * N * T) : undefined;
  for (let f = 0; f < T; f++) {
    let offset = 0;
    for (const p of parts) {
      positions.set(p.positions.subarray(3 * p.nAtoms * f, 3 * p.nAtoms * (f + 1)), 3 * (N * f + offset));
      if (velocities) velocities.set(p.velocities!.subarray(3 * p.nAtoms * f, 3 * p.nAtoms * (f + 1)), 3 * (N * f + offset));
      offset += p.nAtoms;
    }
  }
  const out: Trajectory = { ...first, nAtoms: N, species: parts.flatMap((p) => p.species), positions };
  if (velocities) out.velocities = velocities;
  else delete out.velocities;
  return out;
}

export interface DiatomicKind {
  speciesA: string;
  speciesB: string;
  massA?: number;
  massB?: number;
  wavenumberCm1: number;
  bondLengthA: number;
  molecules: number;
}

/**
 * A box of non-rotating harmonic diatomics of several kinds (HCl and CO, say),
 * sampled every `timeStepPs`. With `translate: false` each molecule has one
 * degree of freedom, its stretch, whose mean kinetic energy is k_BT/2 — for
 * each molecule exactly with `equipartitionEnergy`, else on average.
 */
export function diatomicBox(
  kinds: DiatomicKind[],
  o: { temperatureK: number; timeStepPs: number; frames: number; boxA: number; seed: number; translate?: boolean; velocities?: boolean; equipartitionEnergy?: boolean },
): Trajectory {
  const parts = kinds.map((k, i) => simulateHarmonicDiatomics({
    ...k, temperatureK: o.temperatureK, timeStepPs: o.timeStepPs, frames: o.frames, boxA: o.boxA, seed: o.seed + 101 * i,
    integrator: 'analytic', translate: o.translate, equipartitionEnergy: o.equipartitionEnergy,
  } satisfies HarmonicDiatomicsOptions).trajectory);
  const box = combine(parts);
  if (o.velocities === false) delete box.velocities;
  return box;
}

/**
 * An FCC crystal of n³ cells whose atoms jitter about their sites with
 * independent isotropic Gaussian displacements of std s per component, new
 * every frame: √⟨|u|²⟩/r_nn = √3·s/r_nn exactly (SCIENCE item 23 [DERIVED]).
 */
export function jitteredFcc(cellsPerSide: number, latticeA: number, s: number, frames: number, seed: number): Trajectory {
  const sites = fccLattice(cellsPerSide, latticeA);
  const n = sites.length / 3;
  const rng = new SeededRandom(seed);
  const positions = new Float32Array(3 * n * frames);
  for (let f = 0; f < frames; f++) for (let k = 0; k < 3 * n; k++) positions[3 * n * f + k] = sites[k] + s * rng.normal();
  return {
    nAtoms: n, nFrames: frames, species: new Array<string>(n).fill('Ar'), positions,
    cells: cubicCells(frames, cellsPerSide * latticeA), times: Float64Array.from({ length: frames }, (_, f) => 0.01 * f), boundary: 'periodic',
  };
}

/** Uniform random points in a periodic cube, new every frame: g(r) = 1 and no shell anywhere. */
export function idealGas(n: number, boxA: number, frames: number, seed: number, species = 'Ar'): Trajectory {
  const rng = new SeededRandom(seed);
  const positions = new Float32Array(3 * n * frames);
  for (let k = 0; k < positions.length; k++) positions[k] = rng.uniform() * boxA;
  return {
    nAtoms: n, nFrames: frames, species: new Array<string>(n).fill(species), positions,
    cells: cubicCells(frames, boxA), times: Float64Array.from({ length: frames }, (_, f) => 0.1 * f), boundary: 'periodic',
  };
}

/**
 * Gaussian random walkers of several species with their own D (Å²/ps) in a
 * periodic cube, stored wrapped. Each species' displacements are exactly
 * Gaussian, so its α₂ is 0 at every lag and its MSD is 6·D·t.
 */
export function randomWalkMixture(kinds: { species: string; atoms: number; d: number }[], o: { frames: number; timeStepPs: number; boxA: number; seed: number }): Trajectory {
  const rng = new SeededRandom(o.seed);
  const n = kinds.reduce((s, k) => s + k.atoms, 0);
  const species = kinds.flatMap((k) => new Array<string>(k.atoms).fill(k.species));
  const step = kinds.flatMap((k) => new Array<number>(k.atoms).fill(Math.sqrt(2 * k.d * o.timeStepPs)));
  const positions = new Float32Array(3 * n * o.frames);
  const r = Float64Array.from({ length: 3 * n }, () => rng.uniform() * o.boxA);
  for (let f = 0; f < o.frames; f++) {
    for (let k = 0; k < 3 * n; k++) {
      if (f > 0) r[k] += step[Math.floor(k / 3)] * rng.normal();
      positions[3 * n * f + k] = r[k] - o.boxA * Math.floor(r[k] / o.boxA);
    }
  }
  return {
    nAtoms: n, nFrames: o.frames, species, positions, cells: cubicCells(o.frames, o.boxA),
    times: Float64Array.from({ length: o.frames }, (_, f) => f * o.timeStepPs), boundary: 'periodic',
  };
}
