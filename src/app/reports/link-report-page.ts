import { DatePipe } from '@angular/common';
import { HttpErrorResponse, httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { apiErrorMessage } from '../core/api-error';
import { parseLinkedTarget } from '../series/linked-target';
import type { SeriesSource } from '../series/series-source';
import { SeriesView } from '../series/series-view';
import { unwrap } from '../core/api-envelope';
import type { ReportSource } from './report-source';
import { ReportView } from './report-view';

/** A report or a series opened through an access link: no session, nothing to edit, share or comment on. */
@Component({
  selector: 'erg-link-report-page',
  imports: [DatePipe, ReportView, SeriesView, MatButtonModule, MatIconModule, MatProgressSpinnerModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="page">
      @if (linked.isLoading() && !linked.hasValue()) {
        <div class="state"><mat-spinner diameter="32" aria-label="Loading what was shared" /></div>
      } @else if (gone()) {
        <section class="gone" role="alert" aria-labelledby="gone-heading">
          <mat-icon aria-hidden="true">link_off</mat-icon>
          <h1 id="gone-heading">This link has been revoked or has expired</h1>
          <p>Access links to Ergodic reports and series are read only and stop working when their owner revokes them or their time runs out. Ask the person who sent it for a new link.</p>
        </section>
      } @else if (linked.error()) {
        <div class="state" role="alert">
          <mat-icon aria-hidden="true">error</mat-icon>
          <span>{{ loadError() }}</span>
          <button mat-button type="button" (click)="linked.reload()">Try again</button>
        </div>
      } @else if (linked.value(); as l) {
        <p class="banner" role="note">
          <mat-icon aria-hidden="true">visibility</mat-icon>
          Shared with you read only through an access link, valid until {{ l.expiresAt | date: 'medium' }}.
        </p>
        @if (l.kind === 'report') {
          <erg-report-view [report]="l.report" [source]="source()" />
        } @else {
          <erg-series-view [series]="l.series" [source]="seriesSource()" />
        }
      }
    </div>
  `,
  styles: `
    .banner { display: flex; align-items: center; gap: 8px; margin: 0 0 16px; padding: 8px 14px; border-radius: 12px;
      background: var(--mat-sys-secondary-container); color: var(--mat-sys-on-secondary-container); font: var(--mat-sys-body-medium); }
    .gone { max-width: 60ch; margin: 48px auto; text-align: center; }
    .gone mat-icon { font-size: 48px; width: 48px; height: 48px; color: var(--mat-sys-on-surface-variant); }
  `,
})
export default class LinkReportPage {
  /** From the route, `links/:token`. */
  readonly token = input.required<string>();

  protected readonly source = computed((): ReportSource => ({ kind: 'link', token: this.token() }));
  protected readonly seriesSource = computed((): SeriesSource => ({ kind: 'link', token: this.token() }));
  protected readonly linked = httpResource(() => `/api/links/${encodeURIComponent(this.token())}`, { parse: unwrap('link', parseLinkedTarget) });
  /** Unknown, revoked and expired links answer the same 404 on purpose. */
  protected readonly gone = computed(() => {
    const err = this.linked.error();
    return err instanceof HttpErrorResponse && err.status === 404;
  });

  protected loadError(): string {
    return apiErrorMessage(this.linked.error(), 'What was shared could not be loaded.');
  }
}
