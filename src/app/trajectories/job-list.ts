import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import { JobTracker } from './job-tracker';
import { StatusChip } from './status-chip';

/** Analyses in progress (and just finished) for this project, each with its progress bar. */
@Component({
  selector: 'erg-job-list',
  imports: [RouterLink, MatButtonModule, MatIconModule, MatProgressBarModule, StatusChip],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (jobs().length) {
      <section class="jobs" aria-labelledby="jobs-heading">
        <h3 id="jobs-heading">Analyses</h3>
        <ul>
          @for (job of jobs(); track job.run.id) {
            <li>
              <span class="what">{{ job.trajectoryName }} — {{ job.run.analyses.join(', ') }}</span>
              <erg-status-chip [status]="job.run.status" />
              @if (job.run.status === 'queued' || job.run.status === 'running') {
                <mat-progress-bar [mode]="job.run.status === 'queued' ? 'query' : 'determinate'" [value]="job.run.progress"
                                  [attr.aria-label]="'Progress of the analysis of ' + job.trajectoryName" />
                <span class="pct">{{ job.run.progress }} %</span>
                @if (canEdit()) { <button mat-button type="button" (click)="tracker.cancel(job.run.id)">Cancel</button> }
              } @else if (job.run.status === 'done' && job.run.reportId) {
                <a mat-flat-button [routerLink]="['/reports', job.run.reportId]">Open report</a>
              } @else if (job.run.status === 'failed') {
                <span class="error" role="alert">{{ job.run.error }}</span>
              }
              @if (job.run.status === 'done' || job.run.status === 'failed' || job.run.status === 'cancelled') {
                <button mat-icon-button type="button" (click)="tracker.dismiss(job.run.id)" aria-label="Dismiss"><mat-icon>close</mat-icon></button>
              }
            </li>
          }
        </ul>
      </section>
    }
  `,
  styles: `
    .jobs { margin: 16px 0; padding: 12px 16px; border-radius: 12px; background: var(--mat-sys-surface-container-low); }
    h3 { margin: 0 0 8px; font-size: 15px; }
    ul { list-style: none; margin: 0; padding: 0; display: grid; gap: 8px; }
    li { display: grid; grid-template-columns: minmax(160px, 2fr) auto minmax(120px, 2fr) auto auto; gap: 12px; align-items: center; }
    .what { font-weight: 500; }
    .pct { color: var(--mat-sys-on-surface-variant); }
    .error { color: var(--mat-sys-error); grid-column: span 2; }
  `,
})
export class JobList {
  readonly projectId = input.required<number>();
  readonly canEdit = input(false);
  protected readonly tracker = inject(JobTracker);
  protected readonly jobs = computed(() => this.tracker.jobs().filter((j) => j.run.projectId === this.projectId()));
}
