/**
 * Per-frame periodic cells: inverses for fractional coordinates, volumes and
 * the orthorhombic test. Cells are lattice vectors as rows (a, b, c), so a
 * position is r = s·H for fractional s.
 */
import type { Trajectory } from './trajectory.ts';

export interface CellFrames {
  /** Lattice rows per frame, 9 numbers a frame (Å). */
  cells: Float64Array;
  /** Inverse matrices per frame, 9 numbers a frame (1/Å). */
  inverses: Float64Array;
  /** Volume per frame, Å³. */
  volumes: Float64Array;
  /** True when every frame's cell is diagonal. */
  orthorhombic: boolean;
  /** Which lattice directions repeat (a, b, c); the minimum image and unwrapping act only along these. */
  periodic: [boolean, boolean, boolean];
  /** True when some direction does not repeat (a slab, a wire): volumes then hold vacuum or walls. */
  partlyPeriodic: boolean;
}

/** The lattice directions along which a trajectory repeats: none without a periodic boundary. */
export function periodicAxesOf(traj: Pick<Trajectory, 'boundary' | 'periodicAxes'>): [boolean, boolean, boolean] {
  if (traj.boundary !== 'periodic') return [false, false, false];
  return traj.periodicAxes ? [...traj.periodicAxes] : [true, true, true];
}

const AXIS_NAMES = ['x', 'y', 'z'] as const;

/** "x and y" for a slab; the lattice directions are named x, y, z as the cell's rows a, b, c. */
export function axesText(axes: readonly boolean[]): string {
  const names = AXIS_NAMES.filter((_, k) => axes[k]);
  return names.length === 0 ? 'no direction' : names.length === 1 ? names[0]! : `${names.slice(0, -1).join(', ')} and ${names[names.length - 1]}`;
}

/** Cells of a periodic trajectory (along at least one direction), or null when positions are not periodic. */
export function cellFramesOf(traj: Trajectory): CellFrames | null {
  if (traj.boundary !== 'periodic') return null;
  const periodic = periodicAxesOf(traj);
  if (!periodic.some(Boolean)) return null;
  const cells = traj.cells;
  if (!cells || cells.length !== 9 * traj.nFrames) {
    throw new Error('A periodic trajectory needs one cell (9 numbers) per frame.');
  }
  const inverses = new Float64Array(cells.length);
  const volumes = new Float64Array(traj.nFrames);
  let orthorhombic = true;
  for (let f = 0; f < traj.nFrames; f++) {
    const o = 9 * f;
    const det = invert3(cells, o, inverses, o);
    if (!(Math.abs(det) > 0)) throw new Error(`Cell of frame ${f} is singular.`);
    volumes[f] = Math.abs(det);
    if (cells[o + 1] !== 0 || cells[o + 2] !== 0 || cells[o + 3] !== 0 || cells[o + 5] !== 0 || cells[o + 6] !== 0 || cells[o + 7] !== 0) {
      orthorhombic = false;
    }
  }
  return { cells, inverses, volumes, orthorhombic, periodic, partlyPeriodic: !periodic.every(Boolean) };
}

/** Writes the inverse of the 3×3 matrix at m[mo] into out[oo]; returns the determinant. */
export function invert3(m: ArrayLike<number>, mo: number, out: Float64Array, oo: number): number {
  const a = m[mo], b = m[mo + 1], c = m[mo + 2];
  const d = m[mo + 3], e = m[mo + 4], f = m[mo + 5];
  const g = m[mo + 6], h = m[mo + 7], i = m[mo + 8];
  const A = e * i - f * h, B = -(d * i - f * g), C = d * h - e * g;
  const det = a * A + b * B + c * C;
  const s = 1 / det;
  out[oo] = A * s;
  out[oo + 1] = -(b * i - c * h) * s;
  out[oo + 2] = (b * f - c * e) * s;
  out[oo + 3] = B * s;
  out[oo + 4] = (a * i - c * g) * s;
  out[oo + 5] = -(a * f - c * d) * s;
  out[oo + 6] = C * s;
  out[oo + 7] = -(a * h - b * g) * s;
  out[oo + 8] = (a * e - b * d) * s;
  return det;
}

/**
 * Minimum-image reduction of a displacement (in place, out[0..2]) with the
 * cell of one frame: to fractional, subtract the nearest integer along each
 * periodic direction, back.
 * Exact for orthorhombic cells; for triclinic cells exact when the
 * displacement is shorter than half the smallest cell width, which is all
 * the unwrapping and central differences need.
 */
export function minimumImage(geom: CellFrames, frame: number, d: Float64Array): void {
  const o = 9 * frame;
  const H = geom.cells, G = geom.inverses;
  const x = d[0], y = d[1], z = d[2];
  let s0 = x * G[o] + y * G[o + 3] + z * G[o + 6];
  let s1 = x * G[o + 1] + y * G[o + 4] + z * G[o + 7];
  let s2 = x * G[o + 2] + y * G[o + 5] + z * G[o + 8];
  // Only along directions that repeat: across a wall or vacuum the nearest image is the atom itself.
  const [pa, pb, pc] = geom.periodic;
  if (pa) s0 -= Math.round(s0);
  if (pb) s1 -= Math.round(s1);
  if (pc) s2 -= Math.round(s2);
  d[0] = s0 * H[o] + s1 * H[o + 3] + s2 * H[o + 6];
  d[1] = s0 * H[o + 1] + s1 * H[o + 4] + s2 * H[o + 7];
  d[2] = s0 * H[o + 2] + s1 * H[o + 5] + s2 * H[o + 8];
}

/** Shortest perpendicular width of a frame's cell, Å (volume / largest face area). */
export function shortestCellWidth(cells: ArrayLike<number>, frame: number): number {
  const o = 9 * frame;
  const v = (i: number): [number, number, number] => [cells[o + 3 * i], cells[o + 3 * i + 1], cells[o + 3 * i + 2]];
  const [a, b, c] = [v(0), v(1), v(2)];
  const cross = (p: number[], q: number[]): number[] => [p[1] * q[2] - p[2] * q[1], p[2] * q[0] - p[0] * q[2], p[0] * q[1] - p[1] * q[0]];
  const norm = (p: number[]): number => Math.hypot(p[0], p[1], p[2]);
  const bc = cross(b, c), ca = cross(c, a), ab = cross(a, b);
  const volume = Math.abs(a[0] * bc[0] + a[1] * bc[1] + a[2] * bc[2]);
  return volume / Math.max(norm(bc), norm(ca), norm(ab));
}
