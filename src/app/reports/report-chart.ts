import { ChangeDetectionStrategy, Component, computed, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import type { ECharts } from 'echarts/core';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { NgxEchartsDirective } from 'ngx-echarts';
import type { ChartSpec } from './charts/report-charts-spec';
import { FIGURE_SIZE, pngFigure, svgFigure, type FigureRenderer } from './figure-export';
import { curveCsvUrl, type ReportSource } from './report-source';
import { saveFile } from './save-file';

let nextId = 0;

/**
 * One chart with its downloads: the figure as PNG or SVG (axis titles with
 * units, and an optional caption set under the plot), and the numbers
 * behind it as CSV.
 */
@Component({
  selector: 'erg-report-chart',
  imports: [NgxEchartsDirective, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <figure class="chart-card" [attr.aria-labelledby]="titleId">
      <header>
        <h3 [id]="titleId">{{ spec().title }}</h3>
        <div class="controls">
          <ng-content />
          <button mat-button type="button" [attr.aria-expanded]="captionOpen()" (click)="captionOpen.set(!captionOpen())" [attr.aria-label]="'Caption for ' + spec().title">
            <mat-icon aria-hidden="true">short_text</mat-icon> Caption
          </button>
          <button mat-button type="button" [disabled]="!chart()" (click)="download('png')" [attr.aria-label]="'Download ' + spec().title + ' as PNG'">
            <mat-icon aria-hidden="true">image</mat-icon> PNG
          </button>
          <button mat-button type="button" [disabled]="!chart()" (click)="download('svg')" [attr.aria-label]="'Download ' + spec().title + ' as SVG'">
            <mat-icon aria-hidden="true">draw</mat-icon> SVG
          </button>
          <a mat-button [href]="csvHref()" download [attr.aria-label]="'Download ' + spec().title + ' data as CSV'">
            <mat-icon aria-hidden="true">table_view</mat-icon> CSV
          </a>
        </div>
      </header>
      <div echarts class="plot" [style.height.px]="spec().height ?? 340" role="img" [attr.aria-label]="spec().description" [options]="spec().option" (chartInit)="chart.set($event)"></div>
      @if (captionOpen()) {
        <mat-form-field appearance="outline" class="caption" subscriptSizing="dynamic">
          <mat-label>Caption for the exported figure</mat-label>
          <textarea matInput rows="2" maxlength="600" [value]="caption()" (input)="caption.set($any($event.target).value)"></textarea>
          <mat-hint>Optional. Set under the plot in the PNG and SVG; the page itself does not change.</mat-hint>
        </mat-form-field>
      }
      @if (exportError()) { <p class="form-error" role="alert">{{ exportError() }}</p> }
    </figure>
  `,
  styles: `
    .chart-card { margin: 0; padding: 12px 16px 8px; border-radius: 16px; background: var(--mat-sys-surface-container-lowest); border: 1px solid var(--mat-sys-outline-variant); }
    header { display: flex; align-items: center; justify-content: space-between; gap: 8px; flex-wrap: wrap; }
    h3 { margin: 0; }
    .controls { display: flex; align-items: center; gap: 4px; flex-wrap: wrap; }
    .plot { height: 340px; width: 100%; }
    .caption { width: 100%; margin-top: 8px; }
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

  protected readonly captionOpen = signal(false);
  protected readonly caption = signal('');
  protected readonly exportError = signal<string | null>(null);

  /** The figure drawn afresh at a fixed size, with the caption, whatever the chart's size on screen. */
  protected async download(format: 'png' | 'svg'): Promise<void> {
    this.exportError.set(null);
    try {
      const { echarts } = await import('./echarts-setup');
      const renderer = echarts as unknown as FigureRenderer;
      const request = { option: this.spec().option, caption: this.caption(), ...FIGURE_SIZE };
      const name = `${this.fileStem()}-${this.spec().id}.${format}`;
      if (format === 'png') saveFile(name, pngFigure(renderer, request));
      else saveFile(name, new Blob([svgFigure(renderer, request)], { type: 'image/svg+xml' }));
    } catch {
      this.exportError.set('The figure could not be drawn for download. The CSV still holds every number.');
    }
  }
}
