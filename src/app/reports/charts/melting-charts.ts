import type { ReportCurve } from '../../../../shared/report';
import type { LindemannSummary, NgpSummary } from '../../../../shared/report-summary';
import { finishChart, seriesId } from './chart-finish';
import { annotation, xAxis, yAxis, baseOption, GUIDE, line, type ChartOption, type LineSeries, type ScatterSeries } from './chart-option';
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
  const series: LineSeries[] = lines.flatMap(({ group, values }) => {
    const name = group ? `α₂ ${group}` : 'α₂(t)';
    const out: LineSeries[] = [line(name, points(lag, values).filter(([x]) => x > 0), { id: seriesId(name, group || null), showSymbol: true, symbolSize: 4 })];
    const peak = peaks.find((p) => p.label === group || (lines.length === 1 && !group));
    if (peak?.peakLagPs) {
      // The peak line is part of its species: hidden with it, named in the legend rather than over the curves.
      const marker = annotation(`${group ? `${group} ` : ''}peak at ${Number(peak.peakLagPs.toPrecision(3))} ps`,
        { markLine: { silent: true, symbol: 'none', lineStyle: { type: 'dotted', width: 1.4 }, data: [{ xAxis: peak.peakLagPs }] } });
      // No colour of its own: it takes its species' colour.
      out.push({ ...marker, id: seriesId(`${name} peak`, group || null), itemStyle: undefined, lineStyle: { type: 'dotted', width: 1.4 } });
    }
    return out;
  });
  return finishChart({ ...baseOption(), xAxis: xAxis('lag time t (ps)', 'log'), yAxis: yAxis('α₂'), series }, { x: { name: 'lag time', unit: 'ps' }, y: [''] });
}

/** Each atom's Lindemann index, with the melting threshold as a line. */
export function lindemannChart(curve: ReportCurve, summary: LindemannSummary | undefined): ChartOption {
  const series: ScatterSeries = {
    type: 'scatter', name: 'per atom', symbolSize: 5,
    data: points(column(curve, 'atom') ?? [], column(curve, 'Lindemann index') ?? []),
  };
  const guides: LineSeries[] = summary
    ? [annotation(`melting threshold ${summary.threshold}`, { markLine: { silent: true, symbol: 'none', lineStyle: { color: GUIDE, type: 'dashed' }, data: [{ yAxis: summary.threshold }] } })]
    : [];
  return finishChart({
    ...baseOption(), tooltip: { trigger: 'item' }, xAxis: xAxis('atom index', 'value', { scale: false, min: 0 }),
    yAxis: yAxis('Lindemann index', 'value', { scale: false, min: 0 }), series: [series, ...guides],
  }, { x: { name: 'atom', unit: '' }, y: [''] });
}
