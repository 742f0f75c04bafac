import type { TitleComponentOption } from 'echarts/components';
import type { ComposeOption, EChartsCoreOption } from 'echarts/core';
import type { ChartOption } from './charts/chart-option';

/** The part of the charting library figure export needs: an instance made for a size, without the page. */
export interface FigureRenderer {
  init(dom: HTMLElement | null, theme: null, opts: { renderer: 'svg' | 'canvas'; ssr?: boolean; width: number; height: number }): {
    setOption(option: EChartsCoreOption): void;
    renderToSVGString(): string;
    getDataURL(opts: { type: 'png'; pixelRatio: number; backgroundColor: string }): string;
    dispose(): void;
  };
}

/** A figure for a paper: a fixed size, white ground, no animation, and the caption under the plot. */
export interface FigureRequest {
  option: ChartOption;
  caption: string;
  width: number;
  height: number;
}

/** Figures are drawn at this size, in CSS pixels (PNG doubles it); about a journal's single column at 300 dpi when doubled. */
export const FIGURE_SIZE = { width: 800, height: 500 } as const;

const CAPTION_LINE_PX = 18;
/** Average width of a caption character at 13 px, for the line estimate. */
const CAPTION_CHAR_PX = 6.6;

type FigureOption = ComposeOption<TitleComponentOption> & ChartOption;

/**
 * The chart's own option, made for export: interaction switched off, and the
 * caption (when given) set under the plot as wrapped text, with the plot
 * raised to make room. Axis titles and units come from the chart itself.
 */
export function figureOption(option: ChartOption, caption: string, width: number): FigureOption {
  const text = caption.trim();
  const { tooltip: _tooltip, ...rest } = option;
  // A chart of stacked panels (g(r) over N(r)) keeps every panel; the lowest one makes room for the caption.
  const grids = Array.isArray(option.grid) ? option.grid : [option.grid ?? {}];
  const grid = grids[grids.length - 1] ?? {};
  const bottom = typeof grid.bottom === 'number' ? grid.bottom : 56;
  if (!text) return { ...rest, backgroundColor: '#ffffff', animation: false };
  const perLine = Math.max(20, Math.floor((width - 48) / CAPTION_CHAR_PX));
  const lines = Math.ceil(text.length / perLine);
  return {
    ...rest,
    backgroundColor: '#ffffff',
    animation: false,
    grid: Array.isArray(option.grid)
      ? [...grids.slice(0, -1), { ...grid, bottom: bottom + 12 + lines * CAPTION_LINE_PX }]
      : { ...grid, bottom: bottom + 12 + lines * CAPTION_LINE_PX },
    title: {
      text, left: 24, bottom: 8,
      textStyle: { fontSize: 13, fontWeight: 'normal', color: '#243335', width: width - 48, overflow: 'break', lineHeight: CAPTION_LINE_PX },
    },
  };
}

/** The figure as a standalone SVG document. */
export function svgFigure(renderer: FigureRenderer, request: FigureRequest): string {
  const chart = renderer.init(null, null, { renderer: 'svg', ssr: true, width: request.width, height: request.height });
  try {
    chart.setOption(figureOption(request.option, request.caption, request.width));
    return chart.renderToSVGString();
  } finally {
    chart.dispose();
  }
}

/** The figure as a PNG data URL at twice the CSS size, drawn off screen. */
export function pngFigure(renderer: FigureRenderer, request: FigureRequest): string {
  const host = document.createElement('div');
  const chart = renderer.init(host, null, { renderer: 'canvas', width: request.width, height: request.height });
  try {
    chart.setOption(figureOption(request.option, request.caption, request.width));
    return chart.getDataURL({ type: 'png', pixelRatio: 2, backgroundColor: '#ffffff' });
  } finally {
    chart.dispose();
  }
}
