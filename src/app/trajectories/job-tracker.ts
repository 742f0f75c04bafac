import { DestroyRef, inject, Injectable, signal } from '@angular/core';
import { Router } from '@angular/router';
import type { Subscription } from 'rxjs';
import type { AnalysisRunDto } from '../../../shared/analysis-run';
import { isFinished, watchJob } from './job-watch';
import { TrajectoriesApi } from './trajectories-api';

export interface TrackedJob {
  run: AnalysisRunDto;
  trajectoryName: string;
  /** Open the report when this run finishes (runs the user just started). */
  openWhenDone: boolean;
}

/** Runs the user is watching, with live progress; opens the report of a run they started when it is done. */
@Injectable({ providedIn: 'root' })
export class JobTracker {
  private readonly api = inject(TrajectoriesApi);
  private readonly router = inject(Router);
  private readonly jobsState = signal<TrackedJob[]>([]);
  private readonly watching = new Map<number, Subscription>();
  readonly jobs = this.jobsState.asReadonly();

  constructor() {
    inject(DestroyRef).onDestroy(() => this.watching.forEach((s) => s.unsubscribe()));
  }

  track(run: AnalysisRunDto, trajectoryName: string, openWhenDone: boolean): void {
    if (this.watching.has(run.id)) return;
    this.jobsState.update((list) => [{ run, trajectoryName, openWhenDone }, ...list.filter((j) => j.run.id !== run.id)]);
    const subscription = watchJob(() => this.api.job(run.id)).subscribe({
      next: (latest) => {
        this.jobsState.update((list) => list.map((j) => (j.run.id === latest.id ? { ...j, run: latest } : j)));
        if (isFinished(latest)) {
          this.watching.delete(latest.id);
          const tracked = this.jobsState().find((j) => j.run.id === latest.id);
          if (latest.status === 'done' && latest.reportId && tracked?.openWhenDone) void this.router.navigate(['/reports', latest.reportId]);
        }
      },
      error: () => this.watching.delete(run.id),
    });
    this.watching.set(run.id, subscription);
  }

  cancel(id: number): void {
    this.api.cancelJob(id).subscribe((latest) => this.jobsState.update((list) => list.map((j) => (j.run.id === id ? { ...j, run: latest } : j))));
  }

  dismiss(id: number): void {
    this.watching.get(id)?.unsubscribe();
    this.watching.delete(id);
    this.jobsState.update((list) => list.filter((j) => j.run.id !== id));
  }
}
