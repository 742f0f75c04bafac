import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { takeUntilDestroyed, toObservable } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { RouterLink } from '@angular/router';
import { catchError, EMPTY, filter, switchMap, tap, timer } from 'rxjs';
import type { AnalysisRunDto } from '../../../shared/analysis-run';
import type { TrajectoryDto } from '../../../shared/trajectory';
import { apiErrorMessage } from '../core/api-error';
import { analysesText } from '../../../shared/analysis-labels';
import { JobTracker } from './job-tracker';
import { FinishedRuns } from './finished-runs';
import { isFinished } from './job-watch';
import { StatusChip } from './status-chip';
import { TrajectoriesApi } from './trajectories-api';

/** How often the list looks again while a run is queued or running; when none is, only every IDLE_EVERY-th time. */
const POLL_MS = 2000;
const IDLE_EVERY = 10;
const FIRST_SHOWN = 8;

/**
 * The project's analysis runs as the server keeps them — whoever started
 * them, in whichever tab — live while any is queued or running.
 */
@Component({
  selector: 'erg-project-runs',
  imports: [DatePipe, RouterLink, MatButtonModule, MatIconModule, MatProgressBarModule, StatusChip],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (runs().length || loadError()) {
      <section class="runs" aria-labelledby="runs-heading">
        <h3 id="runs-heading">Analysis runs</h3>
        @if (loadError()) { <p class="error" role="alert">{{ loadError() }}</p> }
        <ul aria-label="Analysis runs of this project">
          @for (run of shown(); track run.id) {
            <li [attr.aria-label]="'Run ' + run.id + ' of ' + nameOf(run) + ': ' + run.status">
              <div class="what">
                <span class="name">{{ nameOf(run) }}</span>
                <span class="muted">{{ analysesOf(run) }} · {{ run.requestedBy.displayName }} · {{ run.createdAt | date: 'short' }}</span>
              </div>
              <erg-status-chip [status]="run.status" />
              <div class="detail">
                @switch (run.status) {
                  @case ('running') {
                    <mat-progress-bar mode="determinate" [value]="run.progress" [attr.aria-label]="'Progress of the analysis of ' + nameOf(run)" />
                    <span class="muted">{{ run.progress }} %</span>
                  }
                  @case ('queued') { <span class="muted">waiting for a worker</span> }
                  @case ('done') {
                    @if (run.reportId) { <a mat-button [routerLink]="['/reports', run.reportId]">Open report</a> }
                  }
                  @case ('failed') { <span class="error">{{ run.error }}</span> }
                  @case ('cancelled') { <span class="muted">{{ run.error ?? 'Cancelled.' }}</span> }
                }
              </div>
              @if (canEdit() && !finished(run)) {
                <button mat-button type="button" (click)="cancel(run)" [attr.aria-label]="'Cancel run ' + run.id + ' of ' + nameOf(run)">Cancel</button>
              }
            </li>
          }
        </ul>
        @if (runs().length > shown().length) {
          <button mat-button type="button" (click)="showAll.set(true)">Show all {{ runs().length }} runs</button>
        }
      </section>
    }
  `,
  styles: `
    .runs { margin: 16px 0; padding: 12px 16px; border-radius: 12px; background: var(--mat-sys-surface-container-low); }
    h3 { margin: 0 0 8px; font: var(--mat-sys-title-small); }
    ul { list-style: none; margin: 0; padding: 0; display: grid; gap: 10px; }
    li { display: grid; grid-template-columns: minmax(0, 2fr) auto minmax(0, 2fr) auto; gap: 4px 12px; align-items: center; }
    .what { display: flex; flex-direction: column; min-width: 0; }
    .name { font-weight: 500; overflow-wrap: anywhere; }
    .detail { display: flex; align-items: center; gap: 8px; min-width: 0; }
    .detail mat-progress-bar { flex: 1; }
    .muted { color: var(--mat-sys-on-surface-variant); font: var(--mat-sys-body-small); }
    .error { color: var(--mat-sys-error); overflow-wrap: anywhere; }
    @media (max-width: 600px) {
      li { grid-template-columns: minmax(0, 1fr) auto; padding-bottom: 8px; border-bottom: 1px solid var(--mat-sys-outline-variant); }
      .detail { grid-column: 1 / -1; }
    }
  `,
})
export class ProjectRuns {
  readonly projectId = input.required<number>();
  /** The project's trajectories, to name each run's file. */
  readonly trajectories = input<TrajectoryDto[]>([]);
  readonly canEdit = input(false);

  private readonly api = inject(TrajectoriesApi);
  private readonly tracker = inject(JobTracker);
  private readonly snack = inject(MatSnackBar);
  private readonly finishedRuns = inject(FinishedRuns);
  protected readonly runs = signal<AnalysisRunDto[]>([]);
  protected readonly loadError = signal('');
  protected readonly showAll = signal(false);
  protected readonly shown = computed(() => (this.showAll() ? this.runs() : this.runs().slice(0, FIRST_SHOWN)));
  private readonly names = computed(() => new Map(this.trajectories().map((t) => [t.id, t.name])));
  private readonly refresh = signal(0);
  protected readonly finished = isFinished;

  constructor() {
    const trigger = computed(() => ({ projectId: this.projectId(), started: this.tracker.started(), refresh: this.refresh() }));
    toObservable(trigger).pipe(
      // Looks now, then every few seconds while a run is queued or running, and now and then otherwise,
      // so runs started elsewhere (another tab, a script) appear too.
      switchMap(({ projectId }) => timer(0, POLL_MS).pipe(
        filter((tick) => tick % IDLE_EVERY === 0 || this.runs().some((r) => !isFinished(r))),
        switchMap(() => this.api.projectRuns(projectId).pipe(catchError((err: unknown) => {
          this.loadError.set(apiErrorMessage(err, 'The analysis runs could not be loaded.'));
          return EMPTY;
        }))),
        tap((list) => {
          this.loadError.set('');
          this.runs.set(list);
          this.finishedRuns.note(this.projectId(), list.flatMap((r) => (r.reportId ? [r.reportId] : [])));
        }),
      )),
      takeUntilDestroyed(),
    ).subscribe();
  }

  protected nameOf(run: AnalysisRunDto): string {
    return this.names().get(run.trajectoryId) ?? `trajectory ${run.trajectoryId}`;
  }

  protected analysesOf(run: AnalysisRunDto): string {
    return analysesText(run.analyses);
  }

  protected cancel(run: AnalysisRunDto): void {
    this.api.cancelJob(run.id).subscribe({
      next: () => this.refresh.update((n) => n + 1),
      error: (err: unknown) => this.snack.open(apiErrorMessage(err, 'The run could not be cancelled.'), 'Close'),
    });
  }
}
