import type { ReportCurve } from '../../../../shared/report';
import { finishChart } from './chart-finish';
import { annotation, xAxis, yAxis, baseOption, GUIDE, line, SHADE, type ChartOption, type LineSeries } from './chart-option';
import { column, points } from './curve-columns';

/** S(q), the low-q range that reflects r_max more than the sample shaded out. */
export function sqChart(curve: ReportCurve, reliableFromInvA: number | null): ChartOption {
  const series: LineSeries[] = [line('S(q)', points(column(curve, 'q') ?? [], column(curve, 'S(q)') ?? []))];
  if (reliableFromInvA !== null && reliableFromInvA > 0) {
    series.push(annotation(`below reliable q (${Number(reliableFromInvA.toPrecision(3))} Å⁻¹)`,
      { markArea: { silent: true, itemStyle: { color: SHADE }, data: [[{ xAxis: 0 }, { xAxis: reliableFromInvA }]] } }, GUIDE, false));
  }
  return finishChart({ ...baseOption(), xAxis: xAxis('q (Å⁻¹)', 'value', { scale: false, min: 0 }), yAxis: yAxis('S(q)'), series },
    { x: { name: 'q', unit: 'Å⁻¹' }, y: [''] });
}
