import type { LineSeriesOption, ScatterSeriesOption } from 'echarts/charts';
import type {
  AxisPointerComponentOption, GridComponentOption, LegendComponentOption, MarkAreaComponentOption, MarkLineComponentOption, TooltipComponentOption,
} from 'echarts/components';
import type { XAXisComponentOption, YAXisComponentOption } from 'echarts';
import type { ComposeOption } from 'echarts/core';

/** Everything a report chart may set; only these parts of the library are registered. */
export type ChartOption = ComposeOption<
  LineSeriesOption | ScatterSeriesOption | GridComponentOption | AxisPointerComponentOption | LegendComponentOption | TooltipComponentOption |
  MarkAreaComponentOption | MarkLineComponentOption
>;
export type LineSeries = LineSeriesOption;
export type ScatterSeries = ScatterSeriesOption;

/** Series colours from Ergodic's palette: lagoon teal, ochre, slate, brick, light teal, sand (tones 40–70). */
export const SERIES_COLOURS = ['#006e79', '#a16c2d', '#40646b', '#af2d30', '#26bdc6', '#d7a168'];
export const INK = '#243335';
export const MUTED = '#4c6265';
export const GRID_LINE = '#dee3e4';
export const GUIDE = '#576061';
/** Fit windows and error bands: primary tone 90, see-through. */
export const BAND = 'rgba(112, 214, 221, 0.28)';
/** Behind labels drawn over data. */
export const LABEL_BACKGROUND = 'rgba(255, 255, 255, 0.85)';
export const SHADE = 'rgba(164, 173, 174, 0.22)';

export function baseOption(): ChartOption {
  return {
    color: SERIES_COLOURS,
    textStyle: { fontFamily: 'Noto Sans, sans-serif', color: INK },
    grid: { left: 72, right: 72, top: 48, bottom: 56 },
    tooltip: { trigger: 'axis', valueFormatter: (v) => (typeof v === 'number' ? String(Number(v.toPrecision(4))) : String(v)) },
    legend: { top: 8, left: 8, right: 8, type: 'plain', textStyle: { color: INK } },
    animation: false,
  };
}

function axisStyle(name: string, type: 'value' | 'log') {
  return {
    type, name, nameLocation: 'middle', nameGap: 36, nameTextStyle: { color: INK },
    axisLabel: { color: MUTED }, axisLine: { lineStyle: { color: MUTED } },
    splitLine: { lineStyle: { color: GRID_LINE } }, scale: type === 'value',
  } as const;
}

export function xAxis(name: string, type: 'value' | 'log' = 'value', extra: Partial<XAXisComponentOption> = {}): XAXisComponentOption {
  return { ...axisStyle(name, type), ...extra } as XAXisComponentOption;
}

export function yAxis(name: string, type: 'value' | 'log' = 'value', extra: Partial<YAXisComponentOption> = {}): YAXisComponentOption {
  return { ...axisStyle(name, type), ...extra } as YAXisComponentOption;
}

export function line(name: string, data: [number, number][], extra: Partial<LineSeries> = {}): LineSeries {
  return { type: 'line', name, data, showSymbol: false, sampling: 'lttb', lineStyle: { width: 1.6 }, ...extra };
}

/**
 * A guide (window, mean, threshold, first minimum…) as a series of its own
 * with no data: its words go in the legend, never over the curves, and
 * clicking its legend entry hides it.
 */
export function annotation(name: string, mark: Pick<LineSeries, 'markLine' | 'markArea'>, colour = GUIDE, dashed = true): LineSeries {
  const markLine = mark.markLine && { ...mark.markLine, label: { show: false }, emphasis: { disabled: true } };
  const markArea = mark.markArea && { ...mark.markArea, label: { show: false }, emphasis: { disabled: true } };
  return {
    type: 'line', name, data: [], showSymbol: false, itemStyle: { color: colour },
    lineStyle: { color: colour, type: dashed ? 'dashed' : 'solid', width: 1.4 }, ...(markLine && { markLine }), ...(markArea && { markArea }),
  };
}
