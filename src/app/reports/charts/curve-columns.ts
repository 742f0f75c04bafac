import type { ReportCurve } from '../../../../shared/report';

/** A column of a curve by its name, or undefined when the curve lacks it. */
export function column(curve: ReportCurve, name: string): (number | null)[] | undefined {
  const i = curve.columns.indexOf(name);
  return i < 0 ? undefined : curve.data[i];
}

/** Columns named "<prefix> <group>", as the engine writes one per group: "MSD all", "MSD Ar"… */
export function groupColumns(curve: ReportCurve, prefix: string): { group: string; values: (number | null)[] }[] {
  return curve.columns.flatMap((c, i) => (c.startsWith(`${prefix} `) ? [{ group: c.slice(prefix.length + 1), values: curve.data[i]! }] : []));
}

/** (x, y) pairs with both defined; on log axes only positive ones can be drawn. */
export function points(x: readonly (number | null)[], y: readonly (number | null)[], scaleY = 1, positiveOnly = false): [number, number][] {
  const out: [number, number][] = [];
  for (let i = 0; i < Math.min(x.length, y.length); i++) {
    const xi = x[i];
    const yi = y[i];
    if (xi === null || xi === undefined || yi === null || yi === undefined) continue;
    if (positiveOnly && (xi <= 0 || yi <= 0)) continue;
    out.push([xi, yi * scaleY]);
  }
  return out;
}

/** y at the point whose x is nearest to `at`. */
export function nearestY(data: readonly [number, number][], at: number): number | null {
  let best: [number, number] | null = null;
  for (const p of data) if (!best || Math.abs(p[0] - at) < Math.abs(best[0] - at)) best = p;
  return best ? best[1] : null;
}
