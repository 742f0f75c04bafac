/**
 * The default range of g(r). Small systems keep the textbook default, half
 * the shortest cell width, where all pairs are cheap. Larger ones get a
 * bounded range, so the pair count per frame grows with N rather than N²:
 * at most a third of the shortest cell width (so the cell-list stencil of
 * three cells per side always applies) and at most the radius that holds
 * about a thousand atoms at the mean density (common practice: g(r) has
 * long converged to 1 there; S(q) resolution is 2π/r_max).
 */

/** Up to this many atoms the default stays half the shortest cell width. */
export const FULL_RANGE_MAX_ATOMS = 2000;
/** Beyond, the default sphere holds about this many atoms. */
export const DEFAULT_SPHERE_ATOMS = 1000;

/** Perpendicular widths of a cell given as lattice-vector rows, and its volume. */
export function cellWidths(cell: ArrayLike<number>): { widths: [number, number, number]; volume: number } {
  const a = [cell[0]!, cell[1]!, cell[2]!], b = [cell[3]!, cell[4]!, cell[5]!], c = [cell[6]!, cell[7]!, cell[8]!];
  const cross = (u: number[], v: number[]) => [u[1]! * v[2]! - u[2]! * v[1]!, u[2]! * v[0]! - u[0]! * v[2]!, u[0]! * v[1]! - u[1]! * v[0]!];
  const norm = (u: number[]) => Math.hypot(u[0]!, u[1]!, u[2]!);
  const bc = cross(b, c), ca = cross(c, a), ab = cross(a, b);
  const volume = Math.abs(a[0]! * bc[0]! + a[1]! * bc[1]! + a[2]! * bc[2]!);
  return { widths: [volume / norm(bc), volume / norm(ca), volume / norm(ab)], volume };
}

/** r_max in Å for g(r) when none is given, or undefined to keep half the shortest width of every frame. */
export function defaultRMaxA(atoms: number, cell: ArrayLike<number> | null): number | undefined {
  if (!cell || atoms <= FULL_RANGE_MAX_ATOMS) return undefined;
  const { widths, volume } = cellWidths(cell);
  if (!(volume > 0)) return undefined;
  const third = (Math.min(...widths) / 3) * (1 - 1e-9);
  const sphere = Math.cbrt((3 * DEFAULT_SPHERE_ATOMS * volume) / (4 * Math.PI * atoms));
  return Math.min(third, sphere);
}
