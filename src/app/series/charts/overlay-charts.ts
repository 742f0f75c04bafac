import type { Overlay, OverlayKind } from '../../../../shared/series-api';
import { baseOption, line, xAxis, yAxis, type LineSeries } from '../../reports/charts/chart-option';
import { formatNumber } from '../../reports/number-format';
import { temperatureColours } from '../temperature-scale';
import type { ChartTable, SeriesChartSpec } from './series-chart-spec';

/** How each overlay is titled, described and drawn; the axes' names and units come with the data. */
const OVERLAY_LOOK: Record<OverlayKind, { title: string; what: string; log: boolean }> = {
  msd: { title: 'MSD of every member', what: 'Mean-square displacement against lag time on log–log axes', log: true },
  vacf: { title: 'VACF of every member', what: 'Normalised velocity autocorrelation against lag time', log: false },
  vdos: { title: 'VDOS of every member', what: 'Vibrational density of states against frequency', log: false },
  rdf: { title: 'g(r) of every member', what: 'Radial distribution function against distance', log: false },
  sq: { title: 'S(q) of every member', what: 'Structure factor against wavevector', log: false },
};

const withUnit = (label: string, unit: string): string => (unit ? `${label} (${unit})` : label);

/** How a member is named in legends: its name and temperature. */
export function memberLabel(name: string, temperatureK: number | null): string {
  return temperatureK === null ? name : `${name} · ${formatNumber(temperatureK, 4)} K`;
}

/** Every member's curve of one kind on one chart, ordered and coloured from cold to hot. */
export function overlayChart(overlay: Overlay): SeriesChartSpec | null {
  const look = OVERLAY_LOOK[overlay.kind];
  const lines = [...overlay.lines].sort((a, b) => (a.temperatureK ?? Infinity) - (b.temperatureK ?? Infinity));
  if (lines.length === 0) return null;
  const colours = temperatureColours(lines.map((l) => l.temperatureK));
  const table: ChartTable = { columns: ['member', 'T (K)', withUnit(overlay.x.label, overlay.x.unit), withUnit(overlay.y.label, overlay.y.unit)], rows: [] };
  const series: LineSeries[] = lines.map((l, i) => {
    const data: [number, number][] = [];
    l.x.forEach((x, j) => {
      const y = l.y[j];
      if (y === null || y === undefined || !Number.isFinite(x) || !Number.isFinite(y)) return;
      table.rows.push([l.name, l.temperatureK, x, y]);
      // A log axis cannot draw zero or below; the CSV still carries the point.
      if (!look.log || (x > 0 && y > 0)) data.push([x, y]);
    });
    return line(memberLabel(l.name, l.temperatureK), data, { itemStyle: { color: colours[i] }, lineStyle: { width: 1.6, color: colours[i] } });
  });
  const yUnit = overlay.y.unit;
  return {
    id: `overlay-${overlay.kind}`,
    title: look.title,
    description: `${look.what}, one line per member, coloured from cold (dark blue) to hot (orange).`,
    option: {
      ...baseOption(),
      tooltip: { trigger: 'axis', valueFormatter: (v) => (typeof v === 'number' ? `${formatNumber(v, 4)}${yUnit ? ` ${yUnit}` : ''}` : String(v)) },
      xAxis: xAxis(withUnit(overlay.x.label, overlay.x.unit), look.log ? 'log' : 'value', look.log ? {} : { scale: false, min: 0 }),
      yAxis: yAxis(withUnit(overlay.y.label, yUnit), look.log ? 'log' : 'value', { nameGap: 48 }),
      series,
    },
    table,
  };
}
