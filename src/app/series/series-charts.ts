import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { provideEchartsCore } from 'ngx-echarts';
import { seriesCurvesSchema } from '../../../shared/series-api';
import type { SeriesResults } from '../../../shared/series-results';
import { unwrap } from '../core/api-envelope';
import { apiErrorMessage } from '../core/api-error';
import type { DiffusionUnit } from '../reports/report-units';
import { caloricChart, heatCapacityChart } from './charts/caloric-charts';
import { overlayChart } from './charts/overlay-charts';
import type { SeriesChartSpec } from './charts/series-chart-spec';
import { arrheniusChart, densityChart, diffusionChart, lindemannChart } from './charts/state-charts';
import { SeriesChart } from './series-chart';
import { seriesCurvesUrl, type SeriesSource } from './series-source';
import { scaleColour } from './temperature-scale';

/** Every chart of a series: properties against temperature first, then the members' curves overlaid. */
@Component({
  selector: 'erg-series-charts',
  imports: [SeriesChart, MatButtonModule, MatProgressSpinnerModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  providers: [provideEchartsCore({ echarts: () => import('./series-echarts-setup').then((m) => m.echarts) })],
  template: `
    <p class="key" aria-label="Colour key">
      <span>Colour shows temperature:</span>
      <span class="ramp" [style.background]="ramp" aria-hidden="true"></span>
      <span>cold → hot.</span>
      <span>Marker shape shows the phase: ■ solid, ● liquid, ▲ vapour, ◆ unclear; hollow markers are left out of fits.</span>
    </p>
    <div class="grid">
      @for (spec of stateSpecs(); track spec.id) {
        <erg-series-chart [spec]="spec" [fileStem]="fileStem()" />
      }
      @for (spec of overlaySpecs(); track spec.id) {
        <erg-series-chart [spec]="spec" [fileStem]="fileStem()" />
      }
    </div>
    @if (curves.isLoading() && !curves.hasValue()) {
      <div class="state"><mat-spinner diameter="24" aria-label="Loading the members' curves" /></div>
    } @else if (curves.error()) {
      <p class="form-error" role="alert">{{ curvesError() }} <button mat-button type="button" (click)="curves.reload()">Try again</button></p>
    }
  `,
  styles: `
    .grid { display: grid; grid-template-columns: repeat(auto-fit, minmax(min(100%, 520px), 1fr)); gap: 16px; }
    .key { display: flex; align-items: center; gap: 8px; flex-wrap: wrap; margin: 0 0 12px; font: var(--mat-sys-body-small); color: var(--mat-sys-on-surface-variant); }
    .ramp { display: inline-block; width: 120px; height: 10px; border-radius: 5px; }
  `,
})
export class SeriesCharts {
  readonly results = input.required<SeriesResults>();
  readonly source = input.required<SeriesSource>();
  readonly unit = input.required<DiffusionUnit>();
  /** Changes when the results are recomputed, so the curves are read again. */
  readonly version = input<string | null>(null);
  readonly fileStem = input.required<string>();

  protected readonly ramp = `linear-gradient(to right, ${Array.from({ length: 9 }, (_, i) => scaleColour(i / 8)).join(', ')})`;
  // Reading the version makes a new request object, so recomputed results bring fresh curves.
  protected readonly curves = httpResource(() => {
    this.version();
    return { url: seriesCurvesUrl(this.source()) };
  }, { parse: unwrap('curves', seriesCurvesSchema) });
  protected readonly stateSpecs = computed(() => {
    const r = this.results();
    const u = this.unit();
    return [arrheniusChart(r, u), diffusionChart(r, u), lindemannChart(r), densityChart(r), caloricChart(r), heatCapacityChart(r)].filter((s): s is SeriesChartSpec => s !== null);
  });
  protected readonly overlaySpecs = computed(() => (this.curves.value() ?? []).map(overlayChart).filter((s): s is SeriesChartSpec => s !== null));

  protected curvesError(): string {
    return apiErrorMessage(this.curves.error(), 'The members’ curves could not be loaded; the charts against temperature above still hold.');
  }
}
