import type { ReportCurve } from '../../../../shared/report';
import type { MsdSummary } from '../../../../shared/report-summary';
import { finishChart, seriesId } from './chart-finish';
import { annotation, xAxis, yAxis, BAND, baseOption, GUIDE, line, type ChartOption, type LineSeries } from './chart-option';
import { column, groupColumns, nearestY, points } from './curve-columns';

/** MSD on log–log axes, one line per species: the fitted window shaded, a slope-1 line through the middle of it. */
export function msdChart(curve: ReportCurve, summary: MsdSummary | undefined): ChartOption {
  const lag = column(curve, 'lag') ?? [];
  const fit = summary?.groups[0]?.fitWindowPs;
  const series: LineSeries[] = groupColumns(curve, 'MSD').map(({ group, values }) =>
    line(`MSD ${group}`, points(lag, values, 1, true), { id: seriesId(`MSD ${group}`, group) }));
  const first = series[0];
  if (first && fit && fit.end > fit.start) {
    const data = first.data as [number, number][];
    const mid = Math.sqrt(Math.max(fit.start, data[0]?.[0] ?? fit.start) * fit.end);
    const anchor = nearestY(data, mid);
    if (anchor !== null && data.length > 1) {
      const x0 = data[0]![0];
      const x1 = data[data.length - 1]![0];
      series.push(line('slope 1 (diffusive)', [[x0, (anchor * x0) / mid], [x1, (anchor * x1) / mid]], {
        lineStyle: { type: 'dashed', color: GUIDE, width: 1 }, itemStyle: { color: GUIDE }, sampling: undefined, tooltip: { show: false },
      }));
    }
    series.push(annotation('fit window', { markArea: { silent: true, itemStyle: { color: BAND }, data: [[{ xAxis: fit.start }, { xAxis: fit.end }]] } }, GUIDE, false));
  }
  return finishChart({ ...baseOption(), xAxis: xAxis('lag time t (ps)', 'log'), yAxis: yAxis('MSD (Å²)', 'log'), series },
    { x: { name: 'lag time', unit: 'ps' }, y: ['Å²'] });
}
