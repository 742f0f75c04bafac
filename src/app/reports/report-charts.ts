import { ChangeDetectionStrategy, Component, computed, input, signal } from '@angular/core';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { provideEchartsCore } from 'ngx-echarts';
import type { ReportDto } from '../../../shared/report';
import { reportChartSpecs } from './charts/report-charts-spec';
import { ReportChart } from './report-chart';
import type { ReportSource } from './report-source';
import { FREQUENCY_UNITS, type DiffusionUnit, type FrequencyUnit } from './report-units';

/** Every chart of a report; loaded on its own so the charting library stays out of the first paint. */
@Component({
  selector: 'erg-report-charts',
  imports: [ReportChart, MatButtonToggleModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  providers: [provideEchartsCore({ echarts: () => import('./echarts-setup').then((m) => m.echarts) })],
  template: `
    @if (specs().length === 0) {
      <p class="muted" role="status">This report has no curves to draw.</p>
    }
    <div class="grid">
      @for (spec of specs(); track spec.id) {
        <erg-report-chart [spec]="spec" [source]="source()" [fileStem]="'ergodic-report-' + report().id">
          @if (spec.id === 'vdos') {
            <mat-button-toggle-group hideSingleSelectionIndicator aria-label="VDOS frequency unit" [value]="frequency()" (change)="frequency.set($event.value)">
              @for (u of frequencyUnits; track u.key) {
                <mat-button-toggle [value]="u.key">{{ u.label }}</mat-button-toggle>
              }
            </mat-button-toggle-group>
          }
        </erg-report-chart>
      }
    </div>
  `,
  styles: `
    .grid { display: grid; grid-template-columns: repeat(auto-fit, minmax(min(100%, 520px), 1fr)); gap: 16px; }
    mat-button-toggle-group { --mat-button-toggle-height: 32px; }
  `,
})
export class ReportCharts {
  readonly report = input.required<ReportDto>();
  readonly source = input.required<ReportSource>();
  readonly diffusionUnit = input.required<DiffusionUnit>();

  protected readonly frequencyUnits = FREQUENCY_UNITS;
  protected readonly frequency = signal<FrequencyUnit>('thz');
  protected readonly specs = computed(() => reportChartSpecs(this.report(), { diffusion: this.diffusionUnit(), frequency: this.frequency() }));
}
