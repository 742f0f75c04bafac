import { DestroyRef, inject, Injectable, signal } from '@angular/core';
import type { Subscription } from 'rxjs';
import type { AnalysisRunDto } from '../../../shared/analysis-run';
import { isFinished, watchJob } from './job-watch';
import { RunNotices } from './run-notices';
import { TrajectoriesApi } from './trajectories-api';

/**
 * Runs started in this tab: each is watched until it ends, and the user is
 * told then, on whatever page they are. Lists of runs read the server, and
 * refresh when `started` changes.
 */
@Injectable({ providedIn: 'root' })
export class JobTracker {
  private readonly api = inject(TrajectoriesApi);
  private readonly notices = inject(RunNotices);
  private readonly watching = new Map<number, Subscription>();
  private readonly startedCount = signal(0);
  /** Changes each time a run is started here, so lists of runs can look again at once. */
  readonly started = this.startedCount.asReadonly();

  constructor() {
    inject(DestroyRef).onDestroy(() => this.watching.forEach((s) => s.unsubscribe()));
  }

  track(run: AnalysisRunDto, trajectoryName: string): void {
    this.startedCount.update((n) => n + 1);
    if (this.watching.has(run.id) || isFinished(run)) return;
    const subscription = watchJob(() => this.api.job(run.id)).subscribe({
      next: (latest) => {
        if (!isFinished(latest)) return;
        this.watching.delete(latest.id);
        this.notices.finished(latest, trajectoryName);
      },
      error: () => this.watching.delete(run.id),
    });
    this.watching.set(run.id, subscription);
  }
}
