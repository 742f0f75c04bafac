import { formatNumber } from '../number-format';
import { engineeringLabel, logExtent } from './axis-labels';
import { SERIES_COLOURS, type ChartOption, type LineSeries, type ScatterSeries } from './chart-option';

type AnySeries = LineSeries | ScatterSeries;

/** What a chart's numbers mean: the x quantity and unit, and one unit per y axis ('' for a pure number). */
export interface ChartUnits {
  x: { name: string; unit: string };
  y: readonly string[];
}

/**
 * A series' id says which species or pair it draws and whether the legend
 * lists it: "L|Ar|MSD Ar" (listed, group Ar), "Q|Ar-Ar|N(r) Ar-Ar" (quiet,
 * its colour is explained by its listed partner), "L||mean" (no group).
 */
export function seriesId(name: string, group: string | null, inLegend = true): string {
  return `${inLegend ? 'L' : 'Q'}|${group ?? ''}|${name}`;
}

export function groupOfSeries(series: { id?: string | number }): string | null {
  const parts = typeof series.id === 'string' ? series.id.split('|') : [];
  return parts.length >= 3 && parts[1] ? parts[1] : null;
}

function inLegend(series: { id?: string | number }): boolean {
  return !(typeof series.id === 'string' && series.id.startsWith('Q|'));
}

/** The species or pairs a chart draws, in order: what its toggles offer. */
export function groupsOf(option: ChartOption): string[] {
  const groups: string[] = [];
  for (const s of (option.series ?? []) as AnySeries[]) {
    const g = groupOfSeries(s);
    if (g && !groups.includes(g)) groups.push(g);
  }
  return groups;
}

/** The same chart without the series of hidden species or pairs; colours stay with their group. */
export function withGroupsHidden(option: ChartOption, hidden: ReadonlySet<string>): ChartOption {
  if (hidden.size === 0) return option;
  const series = ((option.series ?? []) as AnySeries[]).filter((s) => !hidden.has(groupOfSeries(s) ?? ''));
  const legend = option.legend as { data?: string[] } | undefined;
  const names = new Set(series.map((s) => String(s.name)));
  return { ...option, series, legend: { ...legend, data: legend?.data?.filter((n) => names.has(n)) } };
}

function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

function withUnit(value: number, unit: string): string {
  return unit ? `${formatNumber(value, 4)} ${unit}` : formatNumber(value, 4);
}

interface TooltipParam { seriesName?: string; marker?: unknown; value?: unknown; axisValue?: unknown }

/** Tooltip text: the x value with its quantity and unit, then each series' value with the unit of its axis. */
export function tooltipText(params: TooltipParam | TooltipParam[], units: ChartUnits, unitOfSeries: ReadonlyMap<string, string>): string {
  const list = Array.isArray(params) ? params : [params];
  const rows: string[] = [];
  let x: number | null = null;
  for (const p of list) {
    const value = Array.isArray(p.value) ? p.value : null;
    if (!value || typeof value[1] !== 'number') continue;
    if (x === null && typeof value[0] === 'number') x = value[0];
    const name = p.seriesName ?? '';
    rows.push(`${typeof p.marker === 'string' ? p.marker : ''}${escapeHtml(name)}: <b>${escapeHtml(withUnit(value[1], unitOfSeries.get(name) ?? ''))}</b>`);
  }
  if (x === null && typeof list[0]?.axisValue === 'number') x = list[0].axisValue;
  const head = x === null ? '' : `${escapeHtml(units.x.name)} = ${escapeHtml(withUnit(x, units.x.unit))}`;
  return [head, ...rows].filter(Boolean).join('<br>');
}

/** Rows a plain (wrapping) legend needs at the narrowest chart, a phone's 330 px: about 7 px a character plus the symbol. */
export function legendRows(names: readonly string[], width = 330): number {
  if (names.length === 0) return 0;
  let rows = 1;
  let used = 0;
  for (const n of names) {
    const w = 7 * n.length + 40;
    if (used > 0 && used + w > width) {
      rows++;
      used = 0;
    }
    used += w;
  }
  return rows;
}

function raiseTop<G>(grid: G, top: number): G {
  const given = (grid as { top?: unknown } | undefined)?.top;
  return { ...grid, top: typeof given === 'number' ? Math.max(given, top) : top } as G;
}

/**
 * The last step of every report chart: colours by species or pair (the same
 * group keeps its colour in every panel and when others are hidden), a plain
 * legend that wraps instead of paging, room above the plot for it, tooltips
 * with units, engineering-notation tick labels, and log axes spanning only
 * the decades of their data.
 */
export function finishChart(option: ChartOption, units: ChartUnits): ChartOption {
  const series = ((option.series ?? []) as AnySeries[]).map((s) => ({ ...s }));
  const groups = groupsOf({ series });
  let spare = groups.length;
  const colourOf = new Map(groups.map((g, i) => [g, SERIES_COLOURS[i % SERIES_COLOURS.length]!]));
  for (const s of series) {
    const explicit = (s.itemStyle as { color?: unknown } | undefined)?.color ?? ((s as LineSeries).lineStyle as { color?: unknown } | undefined)?.color;
    if (explicit) continue;
    const group = groupOfSeries(s);
    const colour = group ? colourOf.get(group)! : SERIES_COLOURS[spare++ % SERIES_COLOURS.length]!;
    s.itemStyle = { ...(s.itemStyle as object), color: colour };
    if (s.type === 'line') s.lineStyle = { ...s.lineStyle, color: colour };
  }

  const unitOfSeries = new Map<string, string>();
  for (const s of series) unitOfSeries.set(String(s.name), units.y[Number(s.yAxisIndex ?? 0)] ?? '');

  const valuesOnAxis = (axis: 'x' | 'y', index: number) => series.flatMap((s) => {
    const onAxis = axis === 'x' ? Number(s.xAxisIndex ?? 0) === index : Number(s.yAxisIndex ?? 0) === index;
    return onAxis ? ((s.data ?? []) as [number, number][]).map((p) => p[axis === 'x' ? 0 : 1]) : [];
  });
  const finishAxes = <A extends { type?: string; axisLabel?: object; min?: unknown; max?: unknown }>(axes: A | A[] | undefined, axis: 'x' | 'y'): A | A[] | undefined => {
    if (!axes) return axes;
    const list = (Array.isArray(axes) ? axes : [axes]).map((a, i): A => {
      const labelled = { ...a, axisLabel: { ...a.axisLabel, formatter: (v: number) => engineeringLabel(v) } };
      if (a.type !== 'log') return labelled;
      const extent = logExtent(valuesOnAxis(axis, i));
      return extent ? { ...labelled, min: a.min ?? extent.min, max: a.max ?? extent.max } : labelled;
    });
    return Array.isArray(axes) ? list : list[0];
  };

  const legendNames = [...new Set(series.filter(inLegend).map((s) => String(s.name)))];
  const rows = legendRows(legendNames);
  const grid = option.grid;
  const top = 16 + rows * 22;
  return {
    ...option,
    series,
    xAxis: finishAxes(option.xAxis as never, 'x'),
    yAxis: finishAxes(option.yAxis as never, 'y'),
    legend: { ...(option.legend as object), type: 'plain', data: legendNames, show: legendNames.length > 0 },
    grid: Array.isArray(grid) ? grid.map((g, i) => (i === 0 ? raiseTop(g, top) : g)) : raiseTop(grid, top),
    tooltip: { ...(option.tooltip as object), formatter: (params: unknown) => tooltipText(params as TooltipParam[], units, unitOfSeries) },
  };
}
