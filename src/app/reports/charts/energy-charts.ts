import type { ReportCurve } from '../../../../shared/report';
import type { EnergySummary } from '../../../../shared/report-summary';
import { formatWithError } from '../number-format';
import { finishChart } from './chart-finish';
import { GUIDE, baseOption, line, xAxis, yAxis, type ChartOption, type LineSeries } from './chart-option';
import { meanAnnotation } from './thermo-chart';
import { column, points } from './curve-columns';

/**
 * Potential energy per atom (the model's, and the file's dashed beside it when
 * both exist) on the left axis, kinetic energy on the right: they trade places
 * frame by frame.
 */
export function energyChart(curve: ReportCurve): ChartOption {
  const t = column(curve, 'time') ?? [];
  const series: LineSeries[] = [];
  const add = (name: string, label: string, axis: 0 | 1, extra: Partial<LineSeries> = {}) => {
    const c = column(curve, name);
    if (c) series.push(line(label, points(t, c), { yAxisIndex: axis, ...extra }));
  };
  add('potential energy', 'potential', 0);
  add('file potential energy', 'potential (file)', 0, { lineStyle: { width: 1.2, type: 'dashed' } });
  add('kinetic energy', 'kinetic (right axis)', 1);
  return finishChart({
    ...baseOption(),
    xAxis: xAxis('time (ps)'),
    yAxis: [yAxis('potential (eV/atom)', 'value', { nameGap: 60 }), yAxis('kinetic (eV/atom)', 'value', { nameGap: 60, splitLine: { show: false } })],
    series,
  }, { x: { name: 'time', unit: 'ps' }, y: ['eV/atom', 'eV/atom'] });
}

/** Total energy per atom on its own scale, with the fitted drift line: what conservation looks like. */
export function totalEnergyChart(curve: ReportCurve, summary: EnergySummary | undefined): ChartOption {
  const t = column(curve, 'time') ?? [];
  const series: LineSeries[] = [line('total', points(t, column(curve, 'total energy') ?? []))];
  const d = summary?.drift;
  const times = t.filter((x): x is number => x !== null);
  if (d && times.length > 1 && summary?.totalPerAtomEV) {
    // The fitted line through the mean at the mid time; slope in eV/atom/ps.
    const t0 = times[0]!, t1 = times[times.length - 1]!, mid = 0.5 * (t0 + t1), slope = d.perAtomEVPerNs / 1000;
    const at = (x: number) => summary.totalPerAtomEV!.mean + slope * (x - mid);
    series.push(line(`drift ${formatWithError(d.perAtomEVPerNs, d.stdError)} eV/atom/ns`, [[t0, at(t0)], [t1, at(t1)]], { lineStyle: { width: 1.6, type: 'dashed', color: GUIDE }, sampling: undefined }));
  }
  return finishChart({ ...baseOption(), grid: { left: 96, right: 24, top: 48, bottom: 56 }, xAxis: xAxis('time (ps)'), yAxis: yAxis('total (eV/atom)', 'value', { nameGap: 80 }), series },
    { x: { name: 'time', unit: 'ps' }, y: ['eV/atom'] });
}

/** Pressure against time with its mean ± standard error band, and the diagonal tensor components. */
export function pressureChart(curve: ReportCurve, summary: EnergySummary | undefined): ChartOption {
  const t = column(curve, 'time') ?? [];
  const series: LineSeries[] = [line('pressure', points(t, column(curve, 'pressure') ?? []))];
  const mean = summary?.pressureBar;
  for (const c of ['xx', 'yy', 'zz']) {
    const values = column(curve, `pressure ${c}`);
    if (values) series.push(line(`P${c}`, points(t, values), { lineStyle: { width: 0.8, opacity: 0.6 } }));
  }
  const file = column(curve, 'file pressure');
  if (file) series.push(line('pressure (file)', points(t, file), { lineStyle: { width: 1.2, type: 'dashed' } }));
  if (mean) series.push(meanAnnotation(mean, 'bar'));
  return finishChart({ ...baseOption(), xAxis: xAxis('time (ps)'), yAxis: yAxis('pressure (bar)', 'value', { nameGap: 56 }), series },
    { x: { name: 'time', unit: 'ps' }, y: ['bar'] });
}
