import type { ReportCurve } from '../../../../shared/report';
import type { MeanWithError } from '../../../../shared/report-summary';
import { formatWithError } from '../number-format';
import { finishChart } from './chart-finish';
import { annotation, xAxis, yAxis, BAND, baseOption, GUIDE, line, type ChartOption, type LineSeries } from './chart-option';
import { column, points } from './curve-columns';

/** One quantity against time with its block-averaged mean drawn as a line and ± one standard error as a band; the mean's value is in the legend. */
export function timeSeriesChart(curve: ReportCurve, columnName: 'temperature' | 'density', label: string, unit: string, mean: MeanWithError | null | undefined): ChartOption {
  const t = column(curve, 'time') ?? [];
  const series: LineSeries[] = [line(label, points(t, column(curve, columnName) ?? []))];
  if (mean) series.push(meanAnnotation(mean, unit));
  return finishChart({ ...baseOption(), xAxis: xAxis('time (ps)'), yAxis: yAxis(`${label} (${unit})`, 'value', { nameGap: 52 }), series },
    { x: { name: 'time', unit: 'ps' }, y: [unit] });
}

/** "mean 86.5 ± 0.4 K": a dashed line at the mean over a band of ± one standard error. */
export function meanAnnotation(mean: MeanWithError, unit: string): LineSeries {
  return annotation(`mean ${formatWithError(mean.mean, mean.stdError)} ${unit}`, {
    markLine: { silent: true, symbol: 'none', lineStyle: { color: GUIDE, type: 'dashed' }, data: [{ yAxis: mean.mean }] },
    markArea: { silent: true, itemStyle: { color: BAND }, data: [[{ yAxis: mean.mean - mean.stdError }, { yAxis: mean.mean + mean.stdError }]] },
  });
}
