import type { ReportCurve } from '../../../../shared/report';
import type { EnergySummary } from '../../../../shared/report-summary';
import { formatWithError } from '../number-format';
import { BAND, GUIDE, LABEL_BACKGROUND, baseOption, line, xAxis, yAxis, type ChartOption, type LineSeries } from './chart-option';
import { column, points } from './curve-columns';

/**
 * Energies per atom against time: potential and total on the left axis,
 * kinetic on the right (its scale differs), the file's potential energy
 * beside the model's when both exist, and the drift line over the total.
 */
export function energyChart(curve: ReportCurve, summary: EnergySummary | undefined): ChartOption {
  const t = column(curve, 'time') ?? [];
  const series: LineSeries[] = [];
  const add = (name: string, label: string, axis: 0 | 1, extra: Partial<LineSeries> = {}) => {
    const c = column(curve, name);
    if (c) series.push(line(label, points(t, c), { yAxisIndex: axis, ...extra }));
  };
  add('potential energy', 'potential', 0);
  add('total energy', 'total', 0);
  add('file potential energy', 'potential (file)', 0, { lineStyle: { width: 1.2, type: 'dashed' } });
  add('kinetic energy', 'kinetic (right axis)', 1);
  const total = series.find((s) => s.name === 'total');
  const d = summary?.drift;
  const times = t.filter((x): x is number => x !== null);
  if (total && d && times.length > 1 && summary?.totalPerAtomEV) {
    // Draw the fitted line through the mean at the mid time; slope in eV/atom/ps.
    const t0 = times[0]!, t1 = times[times.length - 1]!, mid = 0.5 * (t0 + t1), slope = d.perAtomEVPerNs / 1000;
    const at = (x: number) => summary.totalPerAtomEV!.mean + slope * (x - mid);
    series.push(line(`drift ${formatWithError(d.perAtomEVPerNs, d.stdError)} eV/atom/ns`, [[t0, at(t0)], [t1, at(t1)]], { lineStyle: { width: 1.4, type: 'dotted', color: GUIDE }, sampling: undefined }));
  }
  return {
    ...baseOption(),
    xAxis: xAxis('time (ps)'),
    yAxis: [yAxis('potential, total (eV/atom)', 'value', { nameGap: 56 }), yAxis('kinetic (eV/atom)', 'value', { nameGap: 56, splitLine: { show: false } })],
    series,
  };
}

/** Pressure against time with its mean ± standard error band, and the diagonal tensor components. */
export function pressureChart(curve: ReportCurve, summary: EnergySummary | undefined): ChartOption {
  const t = column(curve, 'time') ?? [];
  const p = line('pressure', points(t, column(curve, 'pressure') ?? []));
  const mean = summary?.pressureBar;
  if (mean) {
    p.markLine = {
      silent: true, symbol: 'none', lineStyle: { color: GUIDE, type: 'dashed' },
      label: { formatter: `mean ${formatWithError(mean.mean, mean.stdError)} bar`, position: 'insideEndTop', color: GUIDE, backgroundColor: LABEL_BACKGROUND, padding: [2, 4] },
      data: [{ yAxis: mean.mean }],
    };
    p.markArea = { silent: true, itemStyle: { color: BAND }, data: [[{ yAxis: mean.mean - mean.stdError }, { yAxis: mean.mean + mean.stdError }]] };
  }
  const series: LineSeries[] = [p];
  for (const c of ['xx', 'yy', 'zz']) {
    const values = column(curve, `pressure ${c}`);
    if (values) series.push(line(`P${c}`, points(t, values), { lineStyle: { width: 0.8, opacity: 0.6 } }));
  }
  const file = column(curve, 'file pressure');
  if (file) series.push(line('pressure (file)', points(t, file), { lineStyle: { width: 1.2, type: 'dashed' } }));
  return { ...baseOption(), xAxis: xAxis('time (ps)'), yAxis: yAxis('pressure (bar)', 'value', { nameGap: 56 }), series };
}
