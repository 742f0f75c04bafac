import type { ReportCurve } from '../../../../shared/report';
import type { VdosSummary } from '../../../../shared/report-summary';
import { formatNumber } from '../number-format';
import { frequencyUnit, type FrequencyUnit } from '../report-units';
import { xAxis, yAxis, baseOption, INK, line, type ChartOption, type ScatterSeries } from './chart-option';
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

/** VDOS on a THz, cm⁻¹ or meV axis, density rescaled so the area still counts modes, with its peaks marked. */
export function vdosChart(curve: ReportCurve, summary: VdosSummary | undefined, unit: FrequencyUnit): ChartOption {
  const u = frequencyUnit(unit);
  const thz = column(curve, 'frequency') ?? [];
  const x = column(curve, u.column) ?? thz;
  const scale = thzPerUnit(thz, x);
  const series = groupColumns(curve, 'VDOS').map(({ group, values }) => line(group, points(x, values, scale), { areaStyle: { opacity: 0.08 } }));
  const all = (series[0]?.data ?? []) as [number, number][];
  const peaks: ScatterSeries = {
    type: 'scatter', name: 'peaks', symbol: 'triangle', symbolSize: 10, symbolRotate: 180, itemStyle: { color: INK },
    data: (summary?.peaks ?? []).map((p) => [p[unit], nearestY(all, p[unit]) ?? 0] as [number, number]),
    label: { show: true, position: 'top', color: INK, formatter: (p) => formatNumber((p.value as number[])[0], 4) },
  };
  return {
    ...baseOption(),
    xAxis: xAxis(`${u.key === 'thz' ? 'frequency' : u.key === 'cm1' ? 'wavenumber' : 'energy'} (${u.label})`, 'value', { scale: false, min: 0 }),
    yAxis: yAxis(`VDOS (modes per ${u.label})`, 'value', { nameGap: 52 }),
    series: [...series, peaks],
  };
}
