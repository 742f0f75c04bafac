import { invertCell, minimumImage, type CellVectors } from './cell-geometry';

/**
 * The path of one atom over the frames leading to the current one, as a
 * polyline ending at the atom's current (wrapped) position. Steps are taken
 * as the shortest periodic image, so an atom that leaves the cell on one side
 * draws a continuous path instead of a line across the box. The path stops
 * at the first frame that is not at hand rather than bridging a gap.
 *
 * @param framesBack positions per frame, newest first (index 0 = current frame)
 */
export function atomPath(framesBack: readonly (Float32Array | undefined)[], atom: number, cell: CellVectors | null): Float32Array {
  const inverse = cell ? invertCell(cell) : null;
  let available = 0;
  while (available < framesBack.length && framesBack[available]) available++;
  const points = new Float32Array(available * 3);
  if (available === 0) return points;
  const step = new Float64Array(3);
  const current = framesBack[0]!;
  const point = [current[atom * 3]!, current[atom * 3 + 1]!, current[atom * 3 + 2]!];
  // Written oldest first so the line is drawn in the direction of time.
  points.set(point, (available - 1) * 3);
  for (let k = 1; k < available; k++) {
    const older = framesBack[k]!;
    const newer = framesBack[k - 1]!;
    for (let c = 0; c < 3; c++) step[c] = older[atom * 3 + c]! - newer[atom * 3 + c]!;
    if (cell && inverse) minimumImage(step, cell, inverse);
    for (let c = 0; c < 3; c++) point[c] = point[c]! + step[c]!;
    points.set(point, (available - 1 - k) * 3);
  }
  return points;
}
