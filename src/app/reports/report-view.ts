import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, output, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import type { ReportDto } from '../../../shared/report';
import { apiErrorMessage } from '../core/api-error';
import { CautionNote } from './caution-note';
import { CitationSection } from './citation-section';
import { HeadlineCardGrid } from './headline-card-grid';
import { headlineCards } from './headline-cards';
import { MethodsSection } from './methods-section';
import { ReportBundleDownload } from './report-bundle-download';
import { ReportCharts } from './report-charts';
import { reportJsonUrl, type ReportSource } from './report-source';
import { DIFFUSION_UNITS, type DiffusionUnit } from './report-units';

/** A report as members and link holders read it; what they may do around it comes from the page. */
@Component({
  selector: 'erg-report-view',
  imports: [DatePipe, CautionNote, CitationSection, HeadlineCardGrid, MethodsSection, ReportCharts, MatButtonModule, MatButtonToggleModule, MatIconModule, MatProgressSpinnerModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <article class="report" aria-labelledby="report-title">
      <header class="head">
        <div>
          <p class="eyebrow">Report · {{ report().trajectoryName }}</p>
          <h1 id="report-title">{{ report().title }}</h1>
          <p class="muted">Computed {{ report().createdAt | date: 'medium' }} · engine {{ report().engineVersion }}</p>
          @if (report().notes) { <p class="notes"><strong>Notes:</strong> {{ report().notes }}</p> }
        </div>
        <div class="actions">
          <ng-content select="[reportActions]" />
          <a mat-stroked-button [href]="jsonHref()" download><mat-icon aria-hidden="true">data_object</mat-icon> Report as JSON</a>
          <button mat-stroked-button type="button" [disabled]="bundling()" (click)="downloadBundle()"
                  aria-label="Download everything: report JSON, methods text, citation and every curve as CSV, in one zip">
            <mat-icon aria-hidden="true">folder_zip</mat-icon> All files (.zip)
          </button>
          @if (canShare()) {
            <button mat-flat-button type="button" (click)="share.emit()"><mat-icon aria-hidden="true">share</mat-icon> Share</button>
          }
        </div>
      </header>

      @if (bundleError()) { <p class="form-error" role="alert">{{ bundleError() }}</p> }
      <erg-caution-note />

      <section aria-labelledby="headline-heading">
        <div class="section-head">
          <h2 id="headline-heading">Headline results</h2>
          @if (hasDiffusion()) {
            <mat-button-toggle-group hideSingleSelectionIndicator aria-label="Diffusion coefficient unit" [value]="diffusionUnit()" (change)="diffusionUnit.set($event.value)">
              @for (u of diffusionUnits; track u.key) {
                <mat-button-toggle [value]="u.key">{{ u.label }}</mat-button-toggle>
              }
            </mat-button-toggle-group>
          }
        </div>
        <erg-headline-card-grid [cards]="cards()" />
      </section>

      <section aria-labelledby="charts-heading">
        <h2 id="charts-heading">Curves</h2>
        @defer (on idle) {
          <erg-report-charts [report]="report()" [source]="source()" [diffusionUnit]="diffusionUnit()" />
        } @placeholder {
          <p class="muted">Charts appear in a moment.</p>
        } @loading (minimum 200ms) {
          <div class="state"><mat-spinner diameter="28" aria-label="Loading charts" /></div>
        } @error {
          <p class="form-error" role="alert">The charts could not be loaded. Reload the page to try again; the CSV and JSON downloads still work.</p>
        }
      </section>

      <erg-methods-section [report]="report()" />
      <erg-citation-section [report]="report()" />
      <ng-content />
    </article>
  `,
  styles: `
    .report { display: flex; flex-direction: column; gap: 24px; }
    .head { display: flex; justify-content: space-between; align-items: flex-start; gap: 16px; flex-wrap: wrap; }
    .eyebrow { margin: 0; font: var(--mat-sys-label-large); color: var(--mat-sys-primary); }
    h1 { margin: 4px 0; }
    h2 { margin: 0 0 12px; }
    .muted { margin: 0; }
    .notes { margin: 8px 0 0; max-width: 70ch; white-space: pre-line; }
    .actions { display: flex; gap: 8px; flex-wrap: wrap; }
    .section-head { display: flex; align-items: center; justify-content: space-between; gap: 12px; flex-wrap: wrap; margin-bottom: 12px; }
    .section-head h2 { margin: 0; }
    mat-button-toggle-group { --mat-button-toggle-height: 34px; }
  `,
})
export class ReportView {
  readonly report = input.required<ReportDto>();
  readonly source = input.required<ReportSource>();
  readonly canShare = input(false);
  readonly share = output<void>();

  protected readonly diffusionUnits = DIFFUSION_UNITS;
  protected readonly diffusionUnit = signal<DiffusionUnit>('e9M2PerS');
  protected readonly cards = computed(() => headlineCards(this.report().summary, this.diffusionUnit()));
  protected readonly hasDiffusion = computed(() => !!(this.report().summary.msd || this.report().summary.vacf));
  protected readonly jsonHref = computed(() => reportJsonUrl(this.source()));

  private readonly bundle = inject(ReportBundleDownload);
  protected readonly bundling = signal(false);
  protected readonly bundleError = signal<string | null>(null);

  protected async downloadBundle(): Promise<void> {
    this.bundling.set(true);
    this.bundleError.set(null);
    try {
      await this.bundle.download(this.report(), this.source());
    } catch (err) {
      this.bundleError.set(apiErrorMessage(err, 'The files could not be gathered. Try again, or download the JSON and CSVs one by one.'));
    } finally {
      this.bundling.set(false);
    }
  }
}
