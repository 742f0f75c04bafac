/**
 * How far a perspective camera must stand from the centre of a sphere of
 * `radius` for the whole sphere to show, with a margin: limited by the
 * narrower of the vertical field of view and the horizontal one, which on a
 * portrait screen (aspect below 1) is the smaller and would otherwise crop
 * the cell at the sides.
 */
export function fitDistance(radius: number, verticalFovDeg: number, aspect: number, margin = 1.05): number {
  const halfVertical = (verticalFovDeg * Math.PI) / 360;
  const halfHorizontal = Math.atan(Math.tan(halfVertical) * aspect);
  return (Math.max(radius, 1) / Math.sin(Math.min(halfVertical, halfHorizontal))) * margin;
}
