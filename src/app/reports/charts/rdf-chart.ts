import type { ReportCurve } from '../../../../shared/report';
import type { RdfSummary } from '../../../../shared/report-summary';
import { finishChart, seriesId } from './chart-finish';
import { annotation, xAxis, yAxis, baseOption, GUIDE, line, type ChartOption, type LineSeries } from './chart-option';
import { column, groupColumns, points } from './curve-columns';

/** With one species the single pair repeats "all" line for line; drawing it twice only hides the first. */
function shown<T extends { group: string }>(groups: T[]): T[] {
  return groups.length === 2 && groups[0]!.group === 'all' ? [groups[0]!] : groups;
}

/** Pixel height the g(r) chart needs for its two panels. */
export const RDF_CHART_HEIGHT = 460;

/**
 * g(r) per pair in the upper panel and the running coordination number N(r)
 * in a lower panel of its own, sharing the r axis: N(r) grows as r³ and on a
 * shared plot would either flatten g(r) or run off the top. The first
 * minimum is marked in both.
 */
export function rdfChart(curve: ReportCurve, summary: RdfSummary | undefined): ChartOption {
  const r = column(curve, 'r') ?? [];
  const g = shown(groupColumns(curve, 'g')).map(({ group, values }) => line(`g(r) ${group}`, points(r, values), { id: seriesId(`g(r) ${group}`, group) }));
  // The lower panel's lines take their pair's colour, so the legend lists only the g(r) lines.
  const n = shown(groupColumns(curve, 'N')).map(({ group, values }) =>
    line(`N(r) ${group}`, points(r, values), { id: seriesId(`N(r) ${group}`, group, false), xAxisIndex: 1, yAxisIndex: 1 }));
  const guides: LineSeries[] = [];
  const shell = summary?.pairs[0]?.firstMinimum;
  if (shell) {
    const name = `first minimum ${Number(shell.rA.toPrecision(3))} Å, N = ${Number(shell.coordination.toPrecision(3))}`;
    const mark = { silent: true, symbol: 'none', lineStyle: { color: GUIDE, type: 'dotted' as const, width: 1.4 }, data: [{ xAxis: shell.rA }] };
    guides.push(annotation(name, { markLine: mark }), { ...annotation(name, { markLine: mark }), xAxisIndex: 1, yAxisIndex: 1 });
  }
  const base = baseOption();
  // Both panels hold the same r values, so their nicely rounded axes end at the same r.
  const rAxis = (gridIndex: number) => xAxis('r (Å)', 'value', { scale: false, min: 0, gridIndex, nameGap: 26 });
  return finishChart({
    ...base,
    grid: [{ left: 64, right: 24, top: 48, bottom: '50%' }, { left: 64, right: 24, top: '66%', bottom: 44 }],
    axisPointer: { link: [{ xAxisIndex: 'all' }] },
    xAxis: [rAxis(0), rAxis(1)],
    yAxis: [yAxis('g(r)', 'value', { scale: false, min: 0, gridIndex: 0 }), yAxis('N(r)', 'value', { scale: false, min: 0, gridIndex: 1 })],
    series: [...g, ...n, ...guides],
  }, { x: { name: 'r', unit: 'Å' }, y: ['', ''] });
}
