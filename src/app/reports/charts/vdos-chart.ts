import type { ReportCurve } from '../../../../shared/report';
import type { VdosSummary } from '../../../../shared/report-summary';
import { frequencyUnit, type FrequencyUnit } from '../report-units';
import { finishChart, seriesId } from './chart-finish';
import { xAxis, yAxis, baseOption, INK, line, type ChartOption, type LineSeries, type ScatterSeries } from './chart-option';
import { column, groupColumns, nearestY, points } from './curve-columns';

/** THz per unit of the chosen axis, read from the curve's own columns so no constant is repeated here. */
function thzPerUnit(thz: readonly (number | null)[], x: readonly (number | null)[]): number {
  for (let i = 0; i < thz.length; i++) {
    const a = thz[i];
    const b = x[i];
    if (a && b) return a / b;
  }
  return 1;
}

/** VDOS on a THz, cm⁻¹ or meV axis, density rescaled so the area still counts modes, with its peaks marked when it has any. */
export function vdosChart(curve: ReportCurve, summary: VdosSummary | undefined, unit: FrequencyUnit): ChartOption {
  const u = frequencyUnit(unit);
  const thz = column(curve, 'frequency') ?? [];
  const x = column(curve, u.column) ?? thz;
  const scale = thzPerUnit(thz, x);
  const series: (LineSeries | ScatterSeries)[] = groupColumns(curve, 'VDOS').map(({ group, values }) =>
    line(`VDOS ${group}`, points(x, values, scale), { id: seriesId(`VDOS ${group}`, group), areaStyle: { opacity: 0.08 } }));
  const all = (series[0]?.data ?? []) as [number, number][];
  const peaks = summary?.peaks ?? [];
  if (peaks.length) {
    // The frequencies are in the tooltip and on the headline card; labels over the curve would hide it.
    series.push({
      type: 'scatter', name: 'peaks', symbol: 'triangle', symbolSize: 10, symbolRotate: 180, itemStyle: { color: INK },
      data: peaks.map((p) => [p[unit], nearestY(all, p[unit]) ?? 0] as [number, number]),
    });
  }
  const quantity = u.key === 'thz' ? 'frequency' : u.key === 'cm1' ? 'wavenumber' : 'energy';
  return finishChart({
    ...baseOption(),
    xAxis: xAxis(`${quantity} (${u.label})`, 'value', { scale: false, min: 0 }),
    yAxis: yAxis(`VDOS (modes per ${u.label})`, 'value', { nameGap: 52 }),
    series,
  }, { x: { name: quantity, unit: u.label }, y: [`modes/${u.label}`] });
}
