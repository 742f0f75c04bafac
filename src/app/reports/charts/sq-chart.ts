import type { ReportCurve } from '../../../../shared/report';
import { xAxis, yAxis, baseOption, GUIDE, LABEL_BACKGROUND, line, SHADE, type ChartOption } from './chart-option';
import { column, points } from './curve-columns';

/** S(q), the low-q range that reflects r_max more than the sample shaded out. */
export function sqChart(curve: ReportCurve, reliableFromInvA: number | null): ChartOption {
  const series = line('S(q)', points(column(curve, 'q') ?? [], column(curve, 'S(q)') ?? []));
  if (reliableFromInvA !== null && reliableFromInvA > 0) {
    series.markArea = { silent: true, itemStyle: { color: SHADE }, label: { show: true, color: GUIDE, position: 'right', backgroundColor: LABEL_BACKGROUND, padding: [2, 4] }, data: [[{ name: 'below reliable q', xAxis: 0 }, { xAxis: reliableFromInvA }]] };
  }
  return { ...baseOption(), xAxis: xAxis('q (Å⁻¹)', 'value', { scale: false, min: 0 }), yAxis: yAxis('S(q)'), series: [series] };
}
