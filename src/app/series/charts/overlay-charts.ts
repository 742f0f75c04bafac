import type { ReportCurve } from '../../../../shared/report';
import { baseOption, line, xAxis, yAxis, type LineSeries } from '../../reports/charts/chart-option';
import { column, groupColumns, points } from '../../reports/charts/curve-columns';
import { formatNumber } from '../../reports/number-format';
import { temperatureColours } from '../temperature-scale';
import type { ChartTable, SeriesChartSpec } from './series-chart-spec';

/** One member's curve of one analysis, with what it is called and its temperature. */
export interface OverlayMember {
  trajectoryId: number;
  name: string;
  temperatureK: number | null;
  curve: ReportCurve | null;
}

/** One overlay: which columns of which curve, and how to draw them. */
interface OverlayKind {
  id: string;
  curve: string;
  title: string;
  description: string;
  x: string;
  /** The y column, or the prefix of per-group columns whose "all" (else first) group is drawn. */
  y: { column: string } | { prefix: string };
  xName: string;
  log: boolean;
}

/** The overlays in reading order; the curve names are those a report's curves carry. */
export const OVERLAY_KINDS: readonly OverlayKind[] = [
  { id: 'msd', curve: 'msd', title: 'MSD of every member', description: 'Mean-square displacement against lag time on log–log axes, one line per member, coloured from cold to hot.', x: 'lag', y: { prefix: 'MSD' }, xName: 'lag time t', log: true },
  { id: 'vacf', curve: 'vacf', title: 'VACF of every member', description: 'Normalised velocity autocorrelation against lag time, one line per member, coloured from cold to hot.', x: 'lag', y: { prefix: 'normalised VACF' }, xName: 'lag time t', log: false },
  { id: 'vdos', curve: 'vdos', title: 'VDOS of every member', description: 'Vibrational density of states against frequency, one line per member, coloured from cold to hot.', x: 'frequency', y: { prefix: 'VDOS' }, xName: 'frequency', log: false },
  { id: 'rdf', curve: 'rdf', title: 'g(r) of every member', description: 'Radial distribution function against distance, one line per member, coloured from cold to hot.', x: 'r', y: { prefix: 'g' }, xName: 'r', log: false },
  { id: 'sq', curve: 'sq', title: 'S(q) of every member', description: 'Structure factor against wavevector, one line per member, coloured from cold to hot.', x: 'q', y: { column: 'S(q)' }, xName: 'q', log: false },
];

interface PickedColumns { x: (number | null)[]; y: (number | null)[]; xUnit: string; yName: string; yUnit: string }

function pick(curve: ReportCurve, kind: OverlayKind): PickedColumns | null {
  const xi = curve.columns.indexOf(kind.x);
  if (xi < 0) return null;
  let yName: string;
  if ('column' in kind.y) {
    yName = kind.y.column;
  } else {
    const groups = groupColumns(curve, kind.y.prefix);
    const chosen = groups.find((g) => g.group === 'all') ?? groups[0];
    if (!chosen) return null;
    yName = `${kind.y.prefix} ${chosen.group}`;
  }
  const yi = curve.columns.indexOf(yName);
  const y = column(curve, yName);
  if (yi < 0 || !y) return null;
  return { x: curve.data[xi]!, y, xUnit: curve.units[xi] ?? '', yName, yUnit: curve.units[yi] ?? '' };
}

const withUnit = (name: string, unit: string): string => (unit ? `${name} (${unit})` : name);

/** How a member is named in legends and CSV rows: its name and temperature. */
export function memberLabel(name: string, temperatureK: number | null): string {
  return temperatureK === null ? name : `${name} · ${formatNumber(temperatureK, 4)} K`;
}

/** One chart per analysis that at least one member has, every member's line coloured by temperature. */
export function overlayChartSpecs(kind: OverlayKind, members: readonly OverlayMember[]): SeriesChartSpec | null {
  const ordered = [...members].sort((a, b) => (a.temperatureK ?? Infinity) - (b.temperatureK ?? Infinity));
  const colours = temperatureColours(ordered.map((m) => m.temperatureK));
  const series: LineSeries[] = [];
  const table: ChartTable = { columns: [], rows: [] };
  let axes: PickedColumns | null = null;
  ordered.forEach((m, i) => {
    const picked = m.curve ? pick(m.curve, kind) : null;
    if (!picked) return;
    axes ??= picked;
    const label = memberLabel(m.name, m.temperatureK);
    const data = points(picked.x, picked.y, 1, kind.log);
    series.push(line(label, data, { itemStyle: { color: colours[i] }, lineStyle: { width: 1.6, color: colours[i] } }));
    for (const [x, y] of data) table.rows.push([m.name, m.temperatureK, x, y]);
  });
  const first = axes as PickedColumns | null;
  if (!first) return null;
  const yLabel = withUnit(first.yName, first.yUnit);
  table.columns = ['member', 'T (K)', withUnit(kind.x, first.xUnit), yLabel];
  const option = {
    ...baseOption(),
    tooltip: { trigger: 'axis' as const, valueFormatter: (v: unknown) => (typeof v === 'number' ? `${formatNumber(v, 4)}${first.yUnit ? ` ${first.yUnit}` : ''}` : String(v)) },
    xAxis: xAxis(withUnit(kind.xName, first.xUnit), kind.log ? 'log' : 'value', kind.log ? {} : { scale: false, min: 0 }),
    yAxis: yAxis(yLabel, kind.log ? 'log' : 'value', { nameGap: 48 }),
    series,
  };
  return { id: `overlay-${kind.id}`, title: kind.title, description: kind.description, option, table };
}
