/**
 * Overlay curves of a series: each member's MSD, VACF, VDOS, g(r) and S(q)
 * on shared axes, read from the same reports its results come from, with
 * the member's temperature and phase for the colour scale and legend.
 */
import type { Overlay, OverlayKind } from '../../../shared/series-api.ts';
import type { AppContext } from '../../context.ts';
import type { StoredCurve } from '../report-curves.ts';
import { curveReader, reportRows } from './member-inputs.ts';
import type { SyncedSeries } from './series-sync.ts';

/** Which columns each chart draws: the whole system's curve ("all") where a report has groups. */
const AXES: Record<OverlayKind, { x: string; y: readonly string[] }> = {
  msd: { x: 'lag', y: ['MSD all'] },
  vacf: { x: 'lag', y: ['normalised VACF all'] },
  vdos: { x: 'frequency', y: ['VDOS all'] },
  rdf: { x: 'r', y: ['g all'] },
  sq: { x: 'q', y: ['S(q)'] },
};

function pick(curve: StoredCurve, names: readonly string[]): number {
  for (const name of names) {
    const i = curve.columns.indexOf(name);
    if (i >= 0) return i;
  }
  return -1;
}

export async function seriesOverlays(ctx: AppContext, synced: SyncedSeries): Promise<Overlay[]> {
  const rows = await reportRows(ctx, synced.members.flatMap((m) => Object.values(m.plan.reportByAnalysis)));
  const curvesOf = curveReader(ctx);
  const resultOf = new Map((synced.results?.members ?? []).map((m) => [m.trajectoryId, m]));
  const overlays: Overlay[] = [];
  for (const kind of Object.keys(AXES) as OverlayKind[]) {
    const axes = AXES[kind];
    let overlay: Overlay | null = null;
    for (const m of synced.members) {
      const reportId = (m.plan.reportByAnalysis as Record<string, number>)[kind];
      const report = reportId !== undefined ? rows.get(reportId) : undefined;
      if (!report) continue;
      const curve = (await curvesOf(report.curvesKey))[kind];
      if (!curve) continue;
      const xi = curve.columns.indexOf(axes.x), yi = pick(curve, axes.y);
      if (xi < 0 || yi < 0) continue;
      overlay ??= {
        kind, x: { label: curve.columns[xi]!, unit: curve.units[xi] ?? '' }, y: { label: curve.columns[yi]!, unit: curve.units[yi] ?? '' }, lines: [],
      };
      // Points without an x (never expected: lags, radii and frequencies are finite) are dropped rather than invented.
      const xs: number[] = [], ys: (number | null)[] = [];
      curve.data[xi]!.forEach((x, k) => {
        if (x !== null && x !== undefined) xs.push(x), ys.push(curve.data[yi]![k] ?? null);
      });
      const result = resultOf.get(m.row.trajectoryId);
      overlay.lines.push({
        trajectoryId: m.row.trajectoryId, name: m.row.trajectory.name, temperatureK: result?.temperatureK ?? m.row.trajectory.temperatureK,
        phase: result?.phase.phase ?? null, reportId: report.id,
        x: xs, y: ys,
      });
    }
    if (overlay) overlays.push(overlay);
  }
  return overlays;
}
