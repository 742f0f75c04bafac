import { ChangeDetectionStrategy, Component, computed, input, signal } from '@angular/core';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { provideEchartsCore } from 'ngx-echarts';
import type { ReportDto } from '../../../shared/report';
import { groupsOf, withGroupsHidden } from './charts/chart-finish';
import { reportChartSpecs, type ChartSpec } from './charts/report-charts-spec';
import { ReportChart } from './report-chart';
import type { ReportSource } from './report-source';
import { FREQUENCY_UNITS, type DiffusionUnit, type FrequencyUnit } from './report-units';

/** Species or pairs drawn at first; the toggles above each chart add the rest. */
const MAX_GROUPS_AT_FIRST = 4;

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
      @for (shown of shownSpecs(); track shown.spec.id) {
        @let spec = shown.spec;
        <erg-report-chart [spec]="spec" [source]="source()" [fileStem]="'ergodic-report-' + report().id">
          @if (shown.groups.length > 1) {
            <mat-button-toggle-group multiple hideMultipleSelectionIndicator class="groups" [attr.aria-label]="'Species shown in ' + spec.title"
                                     [value]="shown.visible" (change)="showOnly(spec.id, shown.groups, $event.value)">
              @for (g of shown.groups; track g) {
                <mat-button-toggle [value]="g">{{ g }}</mat-button-toggle>
              }
            </mat-button-toggle-group>
          }
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
    .groups { flex-wrap: wrap; max-width: 100%; }
  `,
})
export class ReportCharts {
  readonly report = input.required<ReportDto>();
  readonly source = input.required<ReportSource>();
  readonly diffusionUnit = input.required<DiffusionUnit>();

  protected readonly frequencyUnits = FREQUENCY_UNITS;
  protected readonly frequency = signal<FrequencyUnit>('thz');
  protected readonly specs = computed(() => reportChartSpecs(this.report(), { diffusion: this.diffusionUnit(), frequency: this.frequency() }));
  /** Species or pairs switched off, per chart; a chart with many starts with the first few on. */
  private readonly hidden = signal<Record<string, readonly string[]>>({});

  protected readonly shownSpecs = computed(() => this.specs().map((spec) => {
    const groups = groupsOf(spec.option);
    const hidden = new Set(this.hidden()[spec.id] ?? groups.slice(MAX_GROUPS_AT_FIRST));
    const visible = groups.filter((g) => !hidden.has(g));
    const shown: ChartSpec = hidden.size ? { ...spec, option: withGroupsHidden(spec.option, hidden) } : spec;
    return { spec: shown, groups, visible };
  }));

  protected showOnly(chartId: string, groups: readonly string[], visible: readonly string[]): void {
    this.hidden.update((all) => ({ ...all, [chartId]: groups.filter((g) => !visible.includes(g)) }));
  }
}
