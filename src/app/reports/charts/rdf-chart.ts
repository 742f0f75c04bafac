import type { ReportCurve } from '../../../../shared/report';
import type { RdfSummary } from '../../../../shared/report-summary';
import { xAxis, yAxis, baseOption, GUIDE, line, type ChartOption } from './chart-option';
import { column, groupColumns, points } from './curve-columns';

/** With one species the single pair repeats "all" line for line; drawing it twice only hides the first. */
function shown<T extends { group: string }>(groups: T[]): T[] {
  return groups.length === 2 && groups[0]!.group === 'all' ? [groups[0]!] : groups;
}

/** g(r) per pair on the left axis, the running coordination number on the right, the first minimum marked. */
export function rdfChart(curve: ReportCurve, summary: RdfSummary | undefined): ChartOption {
  const r = column(curve, 'r') ?? [];
  const g = shown(groupColumns(curve, 'g')).map(({ group, values }) => line(`g(r) ${group}`, points(r, values)));
  const n = shown(groupColumns(curve, 'N')).map(({ group, values }) => line(`N(r) ${group}`, points(r, values), { yAxisIndex: 1, lineStyle: { type: 'dashed', width: 1.4 } }));
  const shell = summary?.pairs[0]?.firstMinimum;
  const first = g[0];
  if (first && shell) {
    first.markLine = {
      silent: true, symbol: 'none', lineStyle: { color: GUIDE, type: 'dotted' },
      label: { formatter: `first minimum, N = ${Number(shell.coordination.toPrecision(3))}`, color: GUIDE },
      data: [{ xAxis: shell.rA }],
    };
  }
  // N(r) grows as r³; past a few shells it would flatten g(r) into the floor.
  const nMax = shell ? Math.ceil((shell.coordination * 4) / 10) * 10 : undefined;
  return {
    ...baseOption(),
    xAxis: xAxis('r (Å)', 'value', { scale: false, min: 0 }),
    yAxis: [yAxis('g(r)', 'value', { scale: false, min: 0 }), yAxis('coordination N(r)', 'value', { splitLine: { show: false }, scale: false, min: 0, max: nMax })],
    series: [...g, ...n],
  };
}
