import { HttpErrorResponse, httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { MatSnackBar } from '@angular/material/snack-bar';
import { analysisKeySchema, type AnalysisKey } from '../../../shared/analysis-params';
import { analysesText } from '../../../shared/analysis-labels';
import type { ReportDto } from '../../../shared/report';
import { AnalysisDialog, type AnalysisDialogData, type AnalysisDialogResult } from '../trajectories/analysis-dialog';
import { JobTracker } from '../trajectories/job-tracker';
import { RunNotices } from '../trajectories/run-notices';
import { TrajectoriesApi } from '../trajectories/trajectories-api';
import { RouterLink } from '@angular/router';
import { apiErrorMessage } from '../core/api-error';
import { projectSchema } from '../../../shared/projects';
import { CommentsPanel } from './comments-panel';
import { parseReport } from './report-parse';
import { unwrap } from '../core/api-envelope';
import type { ReportSource } from './report-source';
import { ReportView } from './report-view';
import { ShareDialog, type ShareDialogData } from './share-dialog';
import type { ShareTarget } from './share-target';

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
          @if (missing()) {
            <a mat-button routerLink="/projects">Your projects</a>
          } @else {
            <button mat-button type="button" (click)="report.reload()">Try again</button>
          }
        </div>
      } @else if (report.hasValue() ? report.value() : undefined; as r) {
        <nav class="crumbs" aria-label="Breadcrumb"><a [routerLink]="['/projects', r.projectId]">← Back to the project</a></nav>
        <erg-report-view [report]="r" [source]="source()" [canShare]="canShare()" (share)="openShare()">
          @if (canShare()) {
            <span reportActions class="rerun">
              <button mat-stroked-button type="button" (click)="runAgain(r)" [disabled]="starting()"><mat-icon aria-hidden="true">replay</mat-icon> Run again with these settings</button>
              <button mat-stroked-button type="button" (click)="adjust(r)" [disabled]="starting()"><mat-icon aria-hidden="true">tune</mat-icon> Adjust and run</button>
            </span>
          }
          <erg-comments-panel [target]="target()" />
        </erg-report-view>
      }
    </div>
  `,
  styles: `
    .crumbs { margin-bottom: 12px; }
    .rerun { display: contents; }
    .crumbs a { color: var(--mat-sys-primary); }
  `,
})
export default class ReportPage {
  private readonly dialog = inject(MatDialog);
  private readonly snack = inject(MatSnackBar);
  private readonly trajectoriesApi = inject(TrajectoriesApi);
  private readonly tracker = inject(JobTracker);
  private readonly notices = inject(RunNotices);
  protected readonly starting = signal(false);
  /** From the route, `reports/:id`. */
  readonly id = input.required<string>();

  private readonly reportId = computed(() => Number(this.id()));
  protected readonly source = computed((): ReportSource => ({ kind: 'member', reportId: this.reportId() }));
  protected readonly target = computed((): ShareTarget => ({ kind: 'report', id: this.reportId() }));
  protected readonly report = httpResource(() => (Number.isInteger(this.reportId()) ? `/api/reports/${this.reportId()}` : undefined), { parse: unwrap('report', parseReport) });
  // A resource in error throws from value(), so each read asks hasValue() first: a report the
  // user cannot see must end in its message, not in an uncaught error.
  private readonly project = httpResource(() => {
    const r = this.report.hasValue() ? this.report.value() : undefined;
    return r ? `/api/projects/${r.projectId}` : undefined;
  }, { parse: unwrap('project', projectSchema) });
  /** The server refuses viewers anyway; the button is hidden so they are not offered what they cannot do. */
  protected readonly canShare = computed(() => ['owner', 'editor'].includes((this.project.hasValue() ? this.project.value()?.role : undefined) ?? 'viewer'));

  /** Not there, or not for this user (the server does not say which): trying again would not help. */
  protected readonly missing = computed(() => {
    const err = this.report.error();
    return err instanceof HttpErrorResponse && err.status === 404;
  });

  protected loadError(): string {
    return apiErrorMessage(this.report.error(), 'The report could not be loaded.');
  }

  /** The same analyses and settings on the same file; the user is told when it is done. */
  protected runAgain(r: ReportDto): void {
    this.starting.set(true);
    this.trajectoriesApi.startAnalysis(r.trajectoryId, { analyses: analysisKeysOf(r.analyses), params: r.params, notes: r.notes }).subscribe({
      next: (run) => {
        this.starting.set(false);
        this.tracker.track(run, r.trajectoryName);
        this.notices.say(`Started again: ${analysesText(r.analyses)} of ${r.trajectoryName}. You will be told when it is done.`);
      },
      error: (err: unknown) => {
        this.starting.set(false);
        this.snack.open(apiErrorMessage(err, 'The analysis could not be started.'), 'Close');
      },
    });
  }

  /** The analysis dialog, filled with this report's settings, on its file as it is now. */
  protected adjust(r: ReportDto): void {
    this.starting.set(true);
    this.trajectoriesApi.get(r.trajectoryId).subscribe({
      next: (trajectory) => {
        this.starting.set(false);
        const data: AnalysisDialogData = { ...trajectory, preset: { analyses: r.analyses, params: r.params, notes: r.notes } };
        this.dialog.open<AnalysisDialog, AnalysisDialogData, AnalysisDialogResult>(AnalysisDialog, { data, width: '720px' }).afterClosed().subscribe((result) => {
          if (result && result !== 'edit-metadata') {
            this.tracker.track(result, trajectory.name);
            this.notices.say(`Started: you will be told when ${trajectory.name} is done.`);
          }
        });
      },
      error: (err: unknown) => {
        this.starting.set(false);
        this.snack.open(apiErrorMessage(err, 'The trajectory could not be loaded.'), 'Close');
      },
    });
  }

  protected openShare(): void {
    const r = this.report.hasValue() ? this.report.value() : undefined;
    if (!r) return;
    this.dialog.open<ShareDialog, ShareDialogData>(ShareDialog, { data: { target: { kind: 'report', id: r.id }, projectId: r.projectId, title: r.title }, width: '640px', autoFocus: 'first-tabbable' });
  }
}

function analysisKeysOf(keys: readonly string[]): AnalysisKey[] {
  return keys.flatMap((k) => {
    const parsed = analysisKeySchema.safeParse(k);
    return parsed.success ? [parsed.data] : [];
  });
}
