/**
 * The charting library, trimmed to what report charts draw: lines and
 * markers on a canvas with a grid, legend, tooltip, shaded windows and
 * guide lines, plus a title (the caption of an exported figure) and the SVG
 * renderer for figures. Loaded only when the first chart appears.
 */
import { LineChart, ScatterChart } from 'echarts/charts';
import { GridComponent, LegendComponent, MarkAreaComponent, MarkLineComponent, TitleComponent, TooltipComponent } from 'echarts/components';
import * as echarts from 'echarts/core';
import { CanvasRenderer, SVGRenderer } from 'echarts/renderers';

echarts.use([LineChart, ScatterChart, GridComponent, LegendComponent, MarkAreaComponent, MarkLineComponent, TitleComponent, TooltipComponent, CanvasRenderer, SVGRenderer]);

export { echarts };
