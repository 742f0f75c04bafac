import type { ReportCurve } from '../../../../shared/report';
import type { MeanWithError } from '../../../../shared/report-summary';
import { formatWithError } from '../number-format';
import { xAxis, yAxis, BAND, LABEL_BACKGROUND, baseOption, GUIDE, line, type ChartOption } from './chart-option';
import { column, points } from './curve-columns';

/** One quantity against time with its block-averaged mean drawn as a line and ± one standard error as a band. */
export function timeSeriesChart(curve: ReportCurve, columnName: 'temperature' | 'density', label: string, unit: string, mean: MeanWithError | null | undefined): ChartOption {
  const t = column(curve, 'time') ?? [];
  const series = line(label, points(t, column(curve, columnName) ?? []));
  if (mean) {
    series.markLine = {
      silent: true, symbol: 'none', lineStyle: { color: GUIDE, type: 'dashed' },
      label: { formatter: `mean ${formatWithError(mean.mean, mean.stdError)} ${unit}`, position: 'insideEndTop', color: GUIDE, backgroundColor: LABEL_BACKGROUND, padding: [2, 4] },
      data: [{ yAxis: mean.mean }],
    };
    series.markArea = { silent: true, itemStyle: { color: BAND }, data: [[{ yAxis: mean.mean - mean.stdError }, { yAxis: mean.mean + mean.stdError }]] };
  }
  return { ...baseOption(), xAxis: xAxis('time (ps)'), yAxis: yAxis(`${label} (${unit})`, 'value', { nameGap: 52 }), series: [series] };
}
