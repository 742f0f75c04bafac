import type { ReportCurve } from '../../../../shared/report';
import type { LindemannSummary, NgpSummary } from '../../../../shared/report-summary';
import { xAxis, yAxis, baseOption, GUIDE, line, type ChartOption, type ScatterSeries } from './chart-option';
import { column, points } from './curve-columns';

/** α₂(t) on a log time axis, its peak marked: where motion is most heterogeneous. */
export function ngpChart(curve: ReportCurve, summary: NgpSummary | undefined): ChartOption {
  const series = line('α₂(t)', points(column(curve, 'lag') ?? [], column(curve, 'alpha2') ?? []).filter(([x]) => x > 0), { showSymbol: true, symbolSize: 4 });
  if (summary?.peakLagPs) {
    series.markLine = { silent: true, symbol: 'none', lineStyle: { color: GUIDE, type: 'dotted' }, label: { formatter: 'peak', color: GUIDE }, data: [{ xAxis: summary.peakLagPs }] };
  }
  return { ...baseOption(), xAxis: xAxis('lag time t (ps)', 'log'), yAxis: yAxis('α₂'), series: [series] };
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
