import type { ReportCurve } from '../../../../shared/report';
import type { VacfSummary } from '../../../../shared/report-summary';
import { diffusionLabel, perA2PerPs, type DiffusionUnit } from '../report-units';
import { finishChart, seriesId } from './chart-finish';
import { annotation, xAxis, yAxis, BAND, baseOption, GUIDE, line, type ChartOption, type LineSeries } from './chart-option';
import { column, groupColumns, points } from './curve-columns';

/** Normalised VACF on the left axis, the running Green–Kubo D on the right, its plateau window shaded. */
export function vacfChart(curve: ReportCurve, summary: VacfSummary | undefined, unit: DiffusionUnit): ChartOption {
  const lag = column(curve, 'lag') ?? [];
  const window = summary?.groups[0]?.plateauWindowPs;
  const vacf = groupColumns(curve, 'normalised VACF').map(({ group, values }) => line(`VACF ${group}`, points(lag, values), { id: seriesId(`VACF ${group}`, group) }));
  const running: LineSeries[] = groupColumns(curve, 'running D').map(({ group, values }) =>
    line(`running D ${group}`, points(lag, values, perA2PerPs(unit)), { id: seriesId(`running D ${group}`, group), yAxisIndex: 1, lineStyle: { type: 'dashed', width: 1.6 } }));
  const guides: LineSeries[] = [];
  if (window && window.end > window.start) {
    guides.push(annotation('Green–Kubo plateau', { markArea: { silent: true, itemStyle: { color: BAND }, data: [[{ xAxis: window.start }, { xAxis: window.end }]] } }, GUIDE, false));
  }
  return finishChart({
    ...baseOption(),
    xAxis: xAxis('lag time t (ps)'),
    yAxis: [yAxis('normalised VACF'), yAxis(`running D (${diffusionLabel(unit)})`, 'value', { splitLine: { show: false }, nameGap: 48 })],
    series: [...vacf, ...running, ...guides],
  }, { x: { name: 'lag time', unit: 'ps' }, y: ['', diffusionLabel(unit)] });
}
