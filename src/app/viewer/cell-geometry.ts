/**
 * Geometry of a periodic cell given as lattice vectors a, b, c in rows:
 * [ax, ay, az, bx, by, bz, cx, cy, cz], in Å.
 */
export type CellVectors = ArrayLike<number>;

/** Corners as fractional coordinates; edges join corners that differ in one coordinate. */
const CORNERS: readonly (readonly [number, number, number])[] = [
  [0, 0, 0], [1, 0, 0], [0, 1, 0], [0, 0, 1], [1, 1, 0], [1, 0, 1], [0, 1, 1], [1, 1, 1],
];
const EDGES: readonly (readonly [number, number])[] = (() => {
  const edges: [number, number][] = [];
  for (let i = 0; i < CORNERS.length; i++) {
    for (let j = i + 1; j < CORNERS.length; j++) {
      const differing = CORNERS[i]!.filter((v, k) => v !== CORNERS[j]![k]).length;
      if (differing === 1) edges.push([i, j]);
    }
  }
  return edges;
})();

/** The 12 edges of the cell as line-segment end points (24 points, x y z each). */
export function cellEdges(cell: CellVectors): Float32Array {
  const out = new Float32Array(EDGES.length * 6);
  let o = 0;
  for (const [from, to] of EDGES) {
    for (const corner of [CORNERS[from]!, CORNERS[to]!]) {
      for (let k = 0; k < 3; k++) out[o++] = corner[0] * cell[k]! + corner[1] * cell[3 + k]! + corner[2] * cell[6 + k]!;
    }
  }
  return out;
}

/** Lengths |a|, |b|, |c| in Å. */
export function cellLengths(cell: CellVectors): [number, number, number] {
  const length = (r: number) => Math.hypot(cell[r]!, cell[r + 1]!, cell[r + 2]!);
  return [length(0), length(3), length(6)];
}

/** The cell's centre, (a + b + c) / 2. */
export function cellCentre(cell: CellVectors): [number, number, number] {
  return [0, 1, 2].map((k) => (cell[k]! + cell[3 + k]! + cell[6 + k]!) / 2) as [number, number, number];
}

/** Inverse of the row-vector matrix, or null for a flat (zero-volume) cell. */
export function invertCell(cell: CellVectors): Float64Array | null {
  const [a, b, c, d, e, f, g, h, i] = Array.from({ length: 9 }, (_, k) => cell[k]!) as [number, number, number, number, number, number, number, number, number];
  const co = [e * i - f * h, -(d * i - f * g), d * h - e * g];
  const det = a * co[0]! + b * co[1]! + c * co[2]!;
  if (!Number.isFinite(det) || Math.abs(det) < 1e-12) return null;
  return Float64Array.from([
    co[0]!, -(b * i - c * h), b * f - c * e,
    co[1]!, a * i - c * g, -(a * f - c * d),
    co[2]!, -(a * h - b * g), a * e - b * d,
  ], (v) => v / det);
}

/**
 * Replaces a displacement by its periodic image with fractional components
 * in [-½, ½], in place: the shortest image for orthogonal and mildly skewed
 * cells, and always short enough for the step between two saved frames.
 */
export function minimumImage(d: Float64Array, cell: CellVectors, inverse: Float64Array): void {
  const fractional = [0, 1, 2].map((k) => {
    const f = d[0]! * inverse[k]! + d[1]! * inverse[3 + k]! + d[2]! * inverse[6 + k]!;
    return f - Math.round(f);
  });
  for (let k = 0; k < 3; k++) d[k] = fractional[0]! * cell[k]! + fractional[1]! * cell[3 + k]! + fractional[2]! * cell[6 + k]!;
}
