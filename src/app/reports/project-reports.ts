import { DatePipe } from '@angular/common';
import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, untracked } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { RouterLink } from '@angular/router';
import { apiErrorMessage } from '../core/api-error';
import { reportListItemSchema } from '../../../shared/report';
import { unwrapList } from '../core/api-envelope';
import { ANALYSIS_WORDS } from '../trajectories/analysis-words';
import { FinishedRuns } from '../trajectories/finished-runs';

/** A project's reports, newest first, each opening its report page. */
@Component({
  selector: 'erg-project-reports',
  imports: [DatePipe, RouterLink, MatButtonModule, MatIconModule, MatProgressSpinnerModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="reports" aria-labelledby="project-reports-heading">
      <h2 id="project-reports-heading">Reports</h2>
      @if (reports.isLoading() && !reports.hasValue()) {
        <div class="state"><mat-spinner diameter="24" aria-label="Loading reports" /></div>
      } @else if (reports.error()) {
        <div class="state" role="alert">
          <mat-icon aria-hidden="true">error</mat-icon>
          <span>{{ loadError() }}</span>
          <button mat-button type="button" (click)="reports.reload()">Try again</button>
        </div>
      } @else if (rows().length === 0) {
        <p class="muted" role="status">No reports yet. Run analyses on a trajectory; its report appears here when the run is done.</p>
      } @else {
        <ul class="list" aria-label="Reports in this project">
          @for (r of rows(); track r.id) {
            <li>
              <a [routerLink]="['/reports', r.id]" class="title">{{ r.title }}</a>
              <span class="meta">
                {{ r.trajectoryName }} · {{ r.createdAt | date: 'medium' }}
              </span>
              <span class="tags" aria-label="Analyses">
                @for (a of r.analyses; track a) { <span class="tag">{{ words[a] ?? a }}</span> }
              </span>
            </li>
          }
        </ul>
      }
    </section>
  `,
  styles: `
    h2 { margin: 0 0 8px; font: var(--mat-sys-title-large); }
    .list { list-style: none; margin: 0; padding: 0; display: flex; flex-direction: column; }
    li { display: grid; grid-template-columns: 1fr auto; gap: 2px 16px; padding: 10px 4px; border-bottom: 1px solid var(--mat-sys-outline-variant); }
    .title { color: var(--mat-sys-primary); font-weight: 500; }
    .meta { grid-column: 1; font: var(--mat-sys-body-small); color: var(--mat-sys-on-surface-variant); }
    .tags { grid-column: 2; grid-row: 1 / span 2; display: flex; gap: 4px; flex-wrap: wrap; justify-content: flex-end; align-items: center; }
    .tag { padding: 2px 8px; border-radius: 8px; font: var(--mat-sys-label-small); background: var(--mat-sys-secondary-container); color: var(--mat-sys-on-secondary-container); }
  `,
})
export class ProjectReports {
  readonly projectId = input.required<number>();
  private readonly finishedRuns = inject(FinishedRuns);

  protected readonly words = ANALYSIS_WORDS;
  protected readonly reports = httpResource(() => `/api/projects/${this.projectId()}/reports`, { parse: unwrapList('reports', reportListItemSchema) });
  protected readonly rows = computed(() => this.reports.value() ?? []);

  constructor() {
    // A run that finished since the list was read has a report the list does not show yet.
    effect(() => {
      const finished = this.finishedRuns.reportIds(this.projectId());
      const listed = new Set(untracked(() => this.reports.value() ?? []).map((r) => r.id));
      if ([...finished].some((id) => !listed.has(id))) untracked(() => this.reports.reload());
    });
  }

  protected loadError(): string {
    return apiErrorMessage(this.reports.error(), 'The reports could not be loaded.');
  }
}
