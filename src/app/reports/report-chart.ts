import { ChangeDetectionStrategy, Component, computed, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import type { ECharts } from 'echarts/core';
import { NgxEchartsDirective } from 'ngx-echarts';
import type { ChartSpec } from './charts/report-charts-spec';
import { curveCsvUrl, type ReportSource } from './report-source';

let nextId = 0;

/** One chart with its downloads: the picture as PNG, the numbers behind it as CSV. */
@Component({
  selector: 'erg-report-chart',
  imports: [NgxEchartsDirective, MatButtonModule, MatIconModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <figure class="chart-card" [attr.aria-labelledby]="titleId">
      <header>
        <h3 [id]="titleId">{{ spec().title }}</h3>
        <div class="controls">
          <ng-content />
          <button mat-button type="button" [disabled]="!chart()" (click)="downloadPng()" [attr.aria-label]="'Download ' + spec().title + ' as PNG'">
            <mat-icon aria-hidden="true">image</mat-icon> PNG
          </button>
          <a mat-button [href]="csvHref()" download [attr.aria-label]="'Download ' + spec().title + ' data as CSV'">
            <mat-icon aria-hidden="true">table_view</mat-icon> CSV
          </a>
        </div>
      </header>
      <div echarts class="plot" role="img" [attr.aria-label]="spec().description" [options]="spec().option" (chartInit)="chart.set($event)"></div>
    </figure>
  `,
  styles: `
    .chart-card { margin: 0; padding: 12px 16px 8px; border-radius: 16px; background: var(--mat-sys-surface-container-lowest); border: 1px solid var(--mat-sys-outline-variant); }
    header { display: flex; align-items: center; justify-content: space-between; gap: 8px; flex-wrap: wrap; }
    h3 { margin: 0; font: var(--mat-sys-title-medium); }
    .controls { display: flex; align-items: center; gap: 4px; flex-wrap: wrap; }
    .plot { height: 340px; width: 100%; }
  `,
})
export class ReportChart {
  readonly spec = input.required<ChartSpec>();
  readonly source = input.required<ReportSource>();
  /** File names start with this, e.g. "ergodic-report-12". */
  readonly fileStem = input.required<string>();

  protected readonly titleId = `erg-chart-title-${nextId++}`;
  protected readonly chart = signal<ECharts | null>(null);
  protected readonly csvHref = computed(() => curveCsvUrl(this.source(), this.spec().curve));

  protected downloadPng(): void {
    const chart = this.chart();
    if (!chart) return;
    const a = document.createElement('a');
    a.href = chart.getDataURL({ type: 'png', pixelRatio: 2, backgroundColor: '#ffffff' });
    a.download = `${this.fileStem()}-${this.spec().id}.png`;
    a.click();
  }
}
