/**
 * The charting library, trimmed to what report charts draw: lines and
 * markers on a canvas with a grid, legend, tooltip, shaded windows and
 * guide lines. Loaded only when the first chart appears.
 */
import { LineChart, ScatterChart } from 'echarts/charts';
import { GridComponent, LegendComponent, MarkAreaComponent, MarkLineComponent, TooltipComponent } from 'echarts/components';
import * as echarts from 'echarts/core';
import { CanvasRenderer } from 'echarts/renderers';

echarts.use([LineChart, ScatterChart, GridComponent, LegendComponent, MarkAreaComponent, MarkLineComponent, TooltipComponent, CanvasRenderer]);

export { echarts };
