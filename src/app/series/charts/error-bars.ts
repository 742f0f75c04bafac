import type { CustomSeriesOption } from 'echarts/charts';

/** One vertical bar: at x, from low to high, in the colour of its point. */
export interface ErrorBar {
  x: number;
  low: number;
  high: number;
  colour: string;
}

const CAP_PX = 4;

/**
 * Vertical error bars with caps, drawn as a custom series under the points.
 * Named like the points they belong to, so the legend hides both together.
 */
export function errorBars(name: string, bars: readonly ErrorBar[]): CustomSeriesOption {
  return {
    type: 'custom',
    name,
    silent: true,
    z: 1,
    tooltip: { show: false },
    encode: { x: 0, y: [1, 2] },
    data: bars.map((b) => ({ value: [b.x, b.low, b.high], itemStyle: { color: b.colour } })),
    renderItem: (_params, api) => {
      const x = api.value(0) as number;
      const top = api.coord([x, api.value(2) as number]);
      const bottom = api.coord([x, api.value(1) as number]);
      const style = { stroke: api.visual('color') as string, lineWidth: 1.3 };
      const segment = (x1: number, y1: number, x2: number, y2: number) => ({ type: 'line' as const, shape: { x1, y1, x2, y2 }, style });
      return {
        type: 'group',
        children: [
          segment(top[0]!, top[1]!, bottom[0]!, bottom[1]!),
          segment(top[0]! - CAP_PX, top[1]!, top[0]! + CAP_PX, top[1]!),
          segment(bottom[0]! - CAP_PX, bottom[1]!, bottom[0]! + CAP_PX, bottom[1]!),
        ],
      };
    },
  };
}
