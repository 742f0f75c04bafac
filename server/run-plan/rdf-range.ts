/**
 * The default range of g(r): the smaller of half the shortest cell width
 * (the textbook limit of the minimum image) and the radius of the sphere
 * that holds about DEFAULT_SPHERE_ATOMS atoms at the mean density (common
 * practice: g(r) has long converged to 1 there; S(q) resolution is
 * 2π/r_max). So the pairs binned per frame grow with N, not N², and cell
 * lists (which take any r_max up to half the width) keep the pairs visited
 * in step for large systems.
 */
import { DEFAULT_RDF_SPHERE_ATOMS } from '../../shared/analysis-params.ts';

/** The default sphere holds about this many atoms (shared, so the dialog can say it). */
export const DEFAULT_SPHERE_ATOMS = DEFAULT_RDF_SPHERE_ATOMS;
/**
 * The planner sees only the first frame's cell, while the engine's own
 * default is half the shortest width over every frame. A sphere radius this
 * close to half the first width or closer is left to the engine, so a cell
 * that shrinks during the run (a barostat) still holds the range; then the
 * range is at most 1/SHRINK_ALLOWANCE of the sphere radius.
 */
export const SHRINK_ALLOWANCE = 0.9;

/** Perpendicular widths of a cell given as lattice-vector rows, and its volume. */
export function cellWidths(cell: ArrayLike<number>): { widths: [number, number, number]; volume: number } {
  const a = [cell[0]!, cell[1]!, cell[2]!], b = [cell[3]!, cell[4]!, cell[5]!], c = [cell[6]!, cell[7]!, cell[8]!];
  const cross = (u: number[], v: number[]) => [u[1]! * v[2]! - u[2]! * v[1]!, u[2]! * v[0]! - u[0]! * v[2]!, u[0]! * v[1]! - u[1]! * v[0]!];
  const norm = (u: number[]) => Math.hypot(u[0]!, u[1]!, u[2]!);
  const bc = cross(b, c), ca = cross(c, a), ab = cross(a, b);
  const volume = Math.abs(a[0]! * bc[0]! + a[1]! * bc[1]! + a[2]! * bc[2]!);
  return { widths: [volume / norm(bc), volume / norm(ca), volume / norm(ab)], volume };
}

/** min(half the shortest width, radius holding DEFAULT_SPHERE_ATOMS at mean density) of this cell, Å, or undefined without a usable cell. */
export function boundedRMaxA(atoms: number, cell: ArrayLike<number> | null): number | undefined {
  if (!cell || !(atoms > 0)) return undefined;
  const { widths, volume } = cellWidths(cell);
  if (!(volume > 0)) return undefined;
  const sphere = Math.cbrt((3 * DEFAULT_SPHERE_ATOMS * volume) / (4 * Math.PI * atoms));
  return Math.min(Math.min(...widths) / 2, sphere);
}

/**
 * r_max in Å for g(r) when none is given: the sphere radius where it is
 * clearly inside half the shortest width, else undefined to let the engine
 * take half the shortest width of every frame.
 */
export function defaultRMaxA(atoms: number, cell: ArrayLike<number> | null): number | undefined {
  const bounded = boundedRMaxA(atoms, cell);
  if (bounded === undefined) return undefined;
  const half = Math.min(...cellWidths(cell!).widths) / 2;
  return bounded < SHRINK_ALLOWANCE * half ? bounded : undefined;
}
