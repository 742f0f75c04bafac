import type { CustomSeriesOption, LineSeriesOption, ScatterSeriesOption } from 'echarts/charts';
import type {
  GridComponentOption, LegendComponentOption, MarkAreaComponentOption, MarkLineComponentOption, TooltipComponentOption,
} from 'echarts/components';
import type { ComposeOption } from 'echarts/core';

/** What a series chart draws: lines, points and error bars (a custom series); only these are registered. */
export type PlotSeries = LineSeriesOption | ScatterSeriesOption | CustomSeriesOption;

export type SeriesChartOption = ComposeOption<
  PlotSeries | GridComponentOption | LegendComponentOption | TooltipComponentOption | MarkAreaComponentOption | MarkLineComponentOption
>;

/** The numbers behind a chart, as its CSV download writes them: one header per column, units in brackets. */
export interface ChartTable {
  columns: string[];
  rows: (number | string | null)[][];
}

/** One chart of a series: what it shows, read aloud in place of the picture, and the numbers behind it. */
export interface SeriesChartSpec {
  id: string;
  title: string;
  description: string;
  option: SeriesChartOption;
  table: ChartTable;
}

/** A table as CSV text: numbers as they are, text quoted when it holds a comma, quote or line break. */
export function tableCsv(table: ChartTable): string {
  const cell = (v: number | string | null): string => {
    if (v === null) return '';
    if (typeof v === 'number') return Number.isFinite(v) ? String(v) : '';
    // Text a spreadsheet would run as a formula is kept as text.
    const safe = /^[=+\-@]/.test(v) ? `'${v}` : v;
    return /[",\n\r]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
  };
  return [table.columns, ...table.rows].map((row) => row.map(cell).join(',')).join('\n') + '\n';
}
