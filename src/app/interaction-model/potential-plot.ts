import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { NgxEchartsDirective, provideEchartsCore } from 'ngx-echarts';
import type { ResolvedPair } from '../../../shared/interaction-model';
import { pairCurve } from '../../../shared/pair-functions';
import { baseOption, GUIDE, line, xAxis, yAxis, type ChartOption } from '../reports/charts/chart-option';

/** U(r) of one pair up to its cut-off (marked), with the zero line; energies in eV. */
export function potentialOption(pair: ResolvedPair): ChartOption {
  const depth = pair.form === 'lj' ? pair.epsilonEV : pair.form === 'morse' ? pair.depthEV : undefined;
  const curve = pairCurve(pair, 240, depth !== undefined ? 3 * depth : undefined);
  const data = curve.rA.map((r, i): [number, number] => [r, curve.uEV[i]!]);
  const series = line('U(r)', data, {
    markLine: {
      silent: true, symbol: 'none', lineStyle: { color: GUIDE, type: 'dashed' },
      data: [{ xAxis: pair.cutoffA, label: { formatter: `cut-off ${Number(pair.cutoffA.toPrecision(4))} Å`, color: GUIDE } }, { yAxis: 0, label: { show: false } }],
    },
  });
  const option = baseOption();
  return { ...option, legend: { show: false }, grid: { left: 64, right: 24, top: 24, bottom: 44 }, xAxis: xAxis('r (Å)'), yAxis: yAxis('U (eV)', 'value', { nameGap: 48 }), series: [series] };
}

/** A small chart of one pair's U(r). */
@Component({
  selector: 'erg-potential-plot',
  imports: [NgxEchartsDirective],
  changeDetection: ChangeDetectionStrategy.OnPush,
  providers: [provideEchartsCore({ echarts: () => import('../reports/echarts-setup').then((m) => m.echarts) })],
  template: `<div echarts class="plot" role="img" [attr.aria-label]="label()" [options]="option()"></div>`,
  styles: `:host { display: block; min-width: 0; } .plot { height: 200px; width: 100%; }`,
})
export class PotentialPlot {
  readonly pair = input.required<ResolvedPair>();
  protected readonly option = computed(() => potentialOption(this.pair()));
  protected readonly label = computed(() => `U(r) of ${this.pair().species.join('–')} up to the cut-off at ${this.pair().cutoffA} Å`);
}
