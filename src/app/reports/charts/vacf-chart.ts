import type { ReportCurve } from '../../../../shared/report';
import type { VacfSummary } from '../../../../shared/report-summary';
import { diffusionLabel, perA2PerPs, type DiffusionUnit } from '../report-units';
import { xAxis, yAxis, BAND, baseOption, GUIDE, line, type ChartOption, type LineSeries } from './chart-option';
import { column, groupColumns, points } from './curve-columns';

/** Normalised VACF on the left axis, the running Green–Kubo D on the right, its plateau window shaded. */
export function vacfChart(curve: ReportCurve, summary: VacfSummary | undefined, unit: DiffusionUnit): ChartOption {
  const lag = column(curve, 'lag') ?? [];
  const window = summary?.groups[0]?.plateauWindowPs;
  const vacf = groupColumns(curve, 'normalised VACF').map(({ group, values }) => line(`VACF ${group}`, points(lag, values)));
  const running: LineSeries[] = groupColumns(curve, 'running D').map(({ group, values }) =>
    line(`running D ${group}`, points(lag, values, perA2PerPs(unit)), { yAxisIndex: 1, lineStyle: { type: 'dashed', width: 1.6 } }));
  const first = running[0];
  if (first && window && window.end > window.start) {
    first.markArea = { silent: true, itemStyle: { color: BAND }, label: { show: true, position: 'insideTop', color: GUIDE }, data: [[{ name: 'plateau', xAxis: window.start }, { xAxis: window.end }]] };
  }
  return {
    ...baseOption(),
    xAxis: xAxis('lag time t (ps)'),
    yAxis: [yAxis('normalised VACF'), yAxis(`running D (${diffusionLabel(unit)})`, 'value', { splitLine: { show: false }, nameGap: 48 })],
    series: [...vacf, ...running],
  };
}
