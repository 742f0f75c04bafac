import { ChangeDetectionStrategy, Component, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import type { ECharts } from 'echarts/core';
import { NgxEchartsDirective } from 'ngx-echarts';
import { tableCsv, type SeriesChartSpec } from './charts/series-chart-spec';
import { saveBlob, saveHref } from './save-file';

let nextId = 0;

/** One series chart with its downloads: the picture as PNG, the numbers behind it as CSV. */
@Component({
  selector: 'erg-series-chart',
  imports: [NgxEchartsDirective, MatButtonModule, MatIconModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <figure class="chart-card" [attr.aria-labelledby]="titleId">
      <header>
        <h3 [id]="titleId">{{ spec().title }}</h3>
        <div class="controls">
          <button mat-button type="button" [disabled]="!chart()" (click)="downloadPng()" [attr.aria-label]="'Download ' + spec().title + ' as PNG'">
            <mat-icon aria-hidden="true">image</mat-icon> PNG
          </button>
          <button mat-button type="button" (click)="downloadCsv()" [attr.aria-label]="'Download ' + spec().title + ' data as CSV'">
            <mat-icon aria-hidden="true">table_view</mat-icon> CSV
          </button>
        </div>
      </header>
      <div echarts class="plot" role="img" [attr.aria-label]="spec().description" [options]="spec().option" [merge]="spec().option" (chartInit)="chart.set($event)"></div>
    </figure>
  `,
  styles: `
    .chart-card { margin: 0; padding: 12px 16px 8px; border-radius: 16px; background: var(--mat-sys-surface-container-lowest); border: 1px solid var(--mat-sys-outline-variant); }
    header { display: flex; align-items: center; justify-content: space-between; gap: 8px; flex-wrap: wrap; }
    h3 { margin: 0; font: var(--mat-sys-title-medium); }
    .controls { display: flex; align-items: center; gap: 4px; flex-wrap: wrap; }
    .plot { height: 360px; width: 100%; }
  `,
})
export class SeriesChart {
  readonly spec = input.required<SeriesChartSpec>();
  /** File names start with this, e.g. "ergodic-series-4". */
  readonly fileStem = input.required<string>();

  protected readonly titleId = `erg-series-chart-title-${nextId++}`;
  protected readonly chart = signal<ECharts | null>(null);

  protected downloadPng(): void {
    const chart = this.chart();
    if (chart) saveHref(chart.getDataURL({ type: 'png', pixelRatio: 2, backgroundColor: '#ffffff' }), `${this.fileStem()}-${this.spec().id}.png`);
  }

  /** Written here from the numbers the chart draws, so it works the same for members and link holders. */
  protected downloadCsv(): void {
    saveBlob(new Blob([tableCsv(this.spec().table)], { type: 'text/csv;charset=utf-8' }), `${this.fileStem()}-${this.spec().id}.csv`);
  }
}
