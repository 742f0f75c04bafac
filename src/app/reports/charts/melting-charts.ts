import type { ReportCurve } from '../../../../shared/report';
import type { LindemannSummary, NgpSummary } from '../../../../shared/report-summary';
import { xAxis, yAxis, baseOption, GUIDE, line, type ChartOption, type ScatterSeries } from './chart-option';
import { column, groupColumns, points } from './curve-columns';

/**
 * α₂(t) on a log time axis, one line per species (never pooled), each
 * species' peak marked: where its motion is most heterogeneous. Reports
 * before engine 0.2 have a single "alpha2" column.
 */
export function ngpChart(curve: ReportCurve, summary: NgpSummary | undefined): ChartOption {
  const lag = column(curve, 'lag') ?? [];
  const perSpecies = groupColumns(curve, 'alpha2');
  const lines = perSpecies.length ? perSpecies : [{ group: '', values: column(curve, 'alpha2') ?? [] }];
  const peaks = summary?.groups ?? (summary?.peakLagPs ? [{ label: '', peakLagPs: summary.peakLagPs }] : []);
  const series = lines.map(({ group, values }) => {
    const s = line(group ? `α₂ ${group}` : 'α₂(t)', points(lag, values).filter(([x]) => x > 0), { showSymbol: true, symbolSize: 4 });
    const peak = peaks.find((p) => p.label === group || (lines.length === 1 && !group));
    if (peak?.peakLagPs) {
      s.markLine = { silent: true, symbol: 'none', lineStyle: { color: GUIDE, type: 'dotted' }, label: { formatter: group ? `peak ${group}` : 'peak', color: GUIDE }, data: [{ xAxis: peak.peakLagPs }] };
    }
    return s;
  });
  return { ...baseOption(), xAxis: xAxis('lag time t (ps)', 'log'), yAxis: yAxis('α₂'), series };
}

/** Each atom's Lindemann index, with the melting threshold as a line. */
export function lindemannChart(curve: ReportCurve, summary: LindemannSummary | undefined): ChartOption {
  const series: ScatterSeries = {
    type: 'scatter', name: 'per atom', symbolSize: 5,
    data: points(column(curve, 'atom') ?? [], column(curve, 'Lindemann index') ?? []),
  };
  if (summary) {
    series.markLine = { silent: true, symbol: 'none', lineStyle: { color: GUIDE, type: 'dashed' }, label: { formatter: `melting threshold ${summary.threshold}`, position: 'insideEndTop', color: GUIDE }, data: [{ yAxis: summary.threshold }] };
  }
  return { ...baseOption(), tooltip: { trigger: 'item' }, xAxis: xAxis('atom index', 'value', { scale: false, min: 0 }), yAxis: yAxis('Lindemann index', 'value', { scale: false, min: 0 }), series: [series] };
}
