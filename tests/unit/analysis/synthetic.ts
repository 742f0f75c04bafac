/** Synthetic trajectories with known answers, built from the seeded generator. */
import type { Trajectory } from '../../../server/analysis/trajectory.ts';
import { SeededRandom } from '../../../server/simulate/random.ts';

export function makeTrajectory(nAtoms: number, nFrames: number, dt: number, fill: (frame: number, atom: number, out: Float64Array) => void, extra: Partial<Trajectory> = {}): Trajectory {
  const positions = new Float32Array(3 * nAtoms * nFrames);
  const p = new Float64Array(3);
  for (let f = 0; f < nFrames; f++)
    for (let i = 0; i < nAtoms; i++) {
      fill(f, i, p);
      positions.set(p, 3 * (nAtoms * f + i));
    }
  return {
    nAtoms,
    nFrames,
    species: new Array<string>(nAtoms).fill('Ar'),
    positions,
    cells: null,
    times: Float64Array.from({ length: nFrames }, (_, f) => f * dt),
    boundary: 'none',
    ...extra,
  };
}

export function cubicCells(nFrames: number, L: number): Float64Array {
  const c = new Float64Array(9 * nFrames);
  for (let f = 0; f < nFrames; f++) (c[9 * f] = L), (c[9 * f + 4] = L), (c[9 * f + 8] = L);
  return c;
}

/** Gaussian random walk with per-component step variance 2·D·Δt in the given components (others fixed at 0). */
export function randomWalk(nAtoms: number, nFrames: number, dt: number, D: number, seed: number, dims = 3): Trajectory {
  const rng = new SeededRandom(seed);
  const s = Math.sqrt(2 * D * dt);
  const positions = new Float32Array(3 * nAtoms * nFrames);
  for (let i = 0; i < nAtoms; i++) {
    const r = [0, 0, 0];
    for (let f = 0; f < nFrames; f++) {
      for (let c = 0; c < 3; c++) {
        if (f > 0 && c < dims) r[c] += s * rng.normal();
        positions[3 * (nAtoms * f + i) + c] = r[c];
      }
    }
  }
  return { nAtoms, nFrames, species: new Array<string>(nAtoms).fill('Ar'), positions, cells: null, times: Float64Array.from({ length: nFrames }, (_, f) => f * dt), boundary: 'none' };
}

/**
 * Ornstein–Uhlenbeck velocities by the exact discrete generator
 * v ← a·v + √(kT/m·(1−a²))·ξ, a = e^{−γΔt} (SCIENCE item 3), positions by
 * integrating v with the trapezoid rule. Velocities are stored too.
 */
export function ornsteinUhlenbeck(nAtoms: number, nFrames: number, dt: number, gamma: number, kTOverM: number, seed: number): Trajectory {
  const rng = new SeededRandom(seed);
  const a = Math.exp(-gamma * dt);
  const noise = Math.sqrt(kTOverM * (1 - a * a));
  const positions = new Float32Array(3 * nAtoms * nFrames);
  const velocities = new Float32Array(3 * nAtoms * nFrames);
  for (let i = 0; i < nAtoms; i++) {
    for (let c = 0; c < 3; c++) {
      let v = Math.sqrt(kTOverM) * rng.normal();
      let x = 0;
      for (let f = 0; f < nFrames; f++) {
        if (f > 0) {
          const vNew = a * v + noise * rng.normal();
          x += 0.5 * (v + vNew) * dt;
          v = vNew;
        }
        positions[3 * (nAtoms * f + i) + c] = x;
        velocities[3 * (nAtoms * f + i) + c] = v;
      }
    }
  }
  return { nAtoms, nFrames, species: new Array<string>(nAtoms).fill('Ar'), positions, velocities, cells: null, times: Float64Array.from({ length: nFrames }, (_, f) => f * dt), boundary: 'none' };
}
