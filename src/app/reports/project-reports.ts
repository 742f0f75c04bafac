import { DatePipe } from '@angular/common';
import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, signal, untracked } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { MatSelectModule } from '@angular/material/select';
import { RouterLink } from '@angular/router';
import { apiErrorMessage } from '../core/api-error';
import { reportListItemSchema } from '../../../shared/report';
import { unwrapList } from '../core/api-envelope';
import { ANALYSIS_WORDS } from '../../../shared/analysis-labels';
import { FinishedRuns } from '../trajectories/finished-runs';
import { filterAndOrder, keyNumberTexts, REPORT_ORDERS, type ReportOrder } from './report-list-order';

/** A project's reports with what tells them apart (settings in the title, notes, key numbers), filtered and sorted. */
@Component({
  selector: 'erg-project-reports',
  imports: [DatePipe, RouterLink, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatProgressSpinnerModule, MatSelectModule],
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
        <div class="controls">
          <mat-form-field appearance="outline" subscriptSizing="dynamic" class="filter">
            <mat-label>Filter reports</mat-label>
            <mat-icon matPrefix aria-hidden="true">search</mat-icon>
            <input matInput [value]="filter()" (input)="filter.set($any($event.target).value)" placeholder="file, setting, note, number…">
          </mat-form-field>
          <mat-form-field appearance="outline" subscriptSizing="dynamic" class="order">
            <mat-label>Sort reports</mat-label>
            <mat-select [value]="order()" (selectionChange)="order.set($event.value)">
              @for (o of orders; track o.key) { <mat-option [value]="o.key">{{ o.label }}</mat-option> }
            </mat-select>
          </mat-form-field>
        </div>
        <ul class="list" aria-label="Reports in this project">
          @for (r of shown(); track r.id) {
            <li>
              <a [routerLink]="['/reports', r.id]" class="title">{{ r.title }}</a>
              <span class="meta">{{ r.trajectoryName }} · {{ r.createdAt | date: 'medium' }}</span>
              @if (r.notes) { <span class="notes">{{ r.notes }}</span> }
              @if (numbersOf(r).length) {
                <span class="numbers" aria-label="Key numbers">
                  @for (n of numbersOf(r); track n) { <span class="number">{{ n }}</span> }
                </span>
              }
              <span class="tags" aria-label="Analyses">
                @for (a of r.analyses; track a) { <span class="tag">{{ words[a] ?? a }}</span> }
              </span>
            </li>
          } @empty {
            <li class="muted" role="status">No report matches the filter.</li>
          }
        </ul>
      }
    </section>
  `,
  styles: `
    h2 { margin: 0 0 8px; }
    .list { list-style: none; margin: 0; padding: 0; display: flex; flex-direction: column; }
    .controls { display: flex; gap: 12px; flex-wrap: wrap; margin: 4px 0 8px; }
    .filter { flex: 1 1 280px; max-width: 420px; }
    .order { flex: 0 1 220px; }
    li { display: grid; grid-template-columns: minmax(0, 1fr) auto; gap: 4px 16px; padding: 10px 4px; border-bottom: 1px solid var(--mat-sys-outline-variant); }
    .title { color: var(--mat-sys-primary); font-weight: 500; overflow-wrap: anywhere; }
    .meta, .notes, .numbers { grid-column: 1; }
    .meta { font: var(--mat-sys-body-small); color: var(--mat-sys-on-surface-variant); overflow-wrap: anywhere; }
    .notes { font: var(--mat-sys-body-medium); font-style: italic; white-space: pre-line; }
    .numbers { display: flex; flex-wrap: wrap; gap: 4px 12px; font: var(--mat-sys-body-medium); font-variant-numeric: tabular-nums; }
    .tags { grid-column: 2; grid-row: 1 / span 2; display: flex; gap: 4px; flex-wrap: wrap; justify-content: flex-end; align-items: center; }
    @media (max-width: 600px) { .tags { grid-column: 1; grid-row: auto; justify-content: flex-start; } li { grid-template-columns: minmax(0, 1fr); } }
    .tag { padding: 2px 8px; border-radius: 8px; font: var(--mat-sys-label-small); background: var(--mat-sys-secondary-container); color: var(--mat-sys-on-secondary-container); }
  `,
})
export class ProjectReports {
  readonly projectId = input.required<number>();
  private readonly finishedRuns = inject(FinishedRuns);

  protected readonly words = ANALYSIS_WORDS;
  protected readonly reports = httpResource(() => `/api/projects/${this.projectId()}/reports`, { parse: unwrapList('reports', reportListItemSchema) });
  protected readonly rows = computed(() => this.reports.value() ?? []);
  protected readonly orders = REPORT_ORDERS;
  protected readonly filter = signal('');
  protected readonly order = signal<ReportOrder>('newest');
  protected readonly shown = computed(() => filterAndOrder(this.rows(), this.filter(), this.order()));
  protected readonly numbersOf = keyNumberTexts;

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
