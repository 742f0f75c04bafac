import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { RouterLink } from '@angular/router';
import { apiErrorMessage } from '../core/api-error';
import { projectSchema } from '../../../shared/projects';
import { CommentsPanel } from './comments-panel';
import { parseReport } from './report-parse';
import { unwrap } from '../core/api-envelope';
import type { ReportSource } from './report-source';
import { ReportView } from './report-view';
import { ShareDialog, type ShareDialogData } from './share-dialog';

/** A report as a project member reads it: with comments, and sharing for editors and owners. */
@Component({
  selector: 'erg-report-page',
  imports: [RouterLink, CommentsPanel, ReportView, MatButtonModule, MatIconModule, MatProgressSpinnerModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="page">
      @if (report.isLoading() && !report.hasValue()) {
        <div class="state"><mat-spinner diameter="32" aria-label="Loading the report" /></div>
      } @else if (report.error()) {
        <div class="state" role="alert">
          <mat-icon aria-hidden="true">error</mat-icon>
          <span>{{ loadError() }}</span>
          <button mat-button type="button" (click)="report.reload()">Try again</button>
        </div>
      } @else if (report.value(); as r) {
        <nav class="crumbs" aria-label="Breadcrumb"><a [routerLink]="['/projects', r.projectId]">← Back to the project</a></nav>
        <erg-report-view [report]="r" [source]="source()" [canShare]="canShare()" (share)="openShare()">
          <erg-comments-panel [reportId]="r.id" />
        </erg-report-view>
      }
    </div>
  `,
  styles: `
    .crumbs { margin-bottom: 12px; }
    .crumbs a { color: var(--mat-sys-primary); }
  `,
})
export default class ReportPage {
  private readonly dialog = inject(MatDialog);
  /** From the route, `reports/:id`. */
  readonly id = input.required<string>();

  private readonly reportId = computed(() => Number(this.id()));
  protected readonly source = computed((): ReportSource => ({ kind: 'member', reportId: this.reportId() }));
  protected readonly report = httpResource(() => (Number.isInteger(this.reportId()) ? `/api/reports/${this.reportId()}` : undefined), { parse: unwrap('report', parseReport) });
  private readonly project = httpResource(() => {
    const r = this.report.value();
    return r ? `/api/projects/${r.projectId}` : undefined;
  }, { parse: unwrap('project', projectSchema) });
  /** The server refuses viewers anyway; the button is hidden so they are not offered what they cannot do. */
  protected readonly canShare = computed(() => ['owner', 'editor'].includes(this.project.value()?.role ?? 'viewer'));

  protected loadError(): string {
    return apiErrorMessage(this.report.error(), 'The report could not be loaded.');
  }

  protected openShare(): void {
    const r = this.report.value();
    if (!r) return;
    this.dialog.open<ShareDialog, ShareDialogData>(ShareDialog, { data: { reportId: r.id, projectId: r.projectId, title: r.title }, width: '640px', autoFocus: 'first-tabbable' });
  }
}
