/**
 * Lattice vectors from lengths and angles (a, b, c, α, β, γ), in the
 * conventional orientation: a along x, b in the xy plane. Right angles are
 * taken exactly so orthorhombic boxes have no 1e-16 off-diagonal noise.
 */
import type { Cell } from './frame.ts';

function cosDegrees(angle: number): number {
  return angle === 90 ? 0 : Math.cos((angle * Math.PI) / 180);
}

function sinDegrees(angle: number): number {
  return angle === 90 ? 1 : Math.sin((angle * Math.PI) / 180);
}

/** Returns null when the angles describe no real cell (volume² ≤ 0). */
export function cellFromParameters(a: number, b: number, c: number, alpha: number, beta: number, gamma: number): Cell | null {
  const cosA = cosDegrees(alpha);
  const cosB = cosDegrees(beta);
  const cosG = cosDegrees(gamma);
  const sinG = sinDegrees(gamma);
  const cx = c * cosB;
  const cy = (c * (cosA - cosB * cosG)) / sinG;
  const cz2 = c * c - cx * cx - cy * cy;
  if (!(cz2 > 0) || !(sinG > 0)) return null;
  return Float64Array.from([a, 0, 0, b * cosG, b * sinG, 0, cx, cy, Math.sqrt(cz2)]);
}
