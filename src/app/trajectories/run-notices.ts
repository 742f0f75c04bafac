import { inject, Injectable } from '@angular/core';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router } from '@angular/router';
import type { AnalysisRunDto } from '../../../shared/analysis-run';
import { analysesText } from '../../../shared/analysis-labels';

interface Notice {
  message: string;
  action: string;
  reportId: number | null;
  durationMs: number | undefined;
}

/**
 * Tells the user that a run they started has ended, wherever they are, and
 * never takes them anywhere by itself: the report opens only from the
 * notice's own button. Notices queue, so two finishing runs give two notices.
 */
@Injectable({ providedIn: 'root' })
export class RunNotices {
  private readonly snack = inject(MatSnackBar);
  private readonly router = inject(Router);
  private readonly waiting: Notice[] = [];
  private showing = false;

  finished(run: AnalysisRunDto, trajectoryName: string): void {
    const what = `The analysis of ${trajectoryName} (${analysesText(run.analyses)})`;
    if (run.status === 'done') {
      this.waiting.push({ message: `${what} is done.`, action: 'Open report', reportId: run.reportId, durationMs: 10_000 });
    } else if (run.status === 'failed') {
      this.waiting.push({ message: `${what} failed: ${run.error ?? 'no reason was given'}`, action: 'Close', reportId: null, durationMs: undefined });
    }
    this.showNext();
  }

  /** A short message about runs (one was started), in turn with the others so none hides another. */
  say(message: string): void {
    this.waiting.push({ message, action: 'Close', reportId: null, durationMs: 5000 });
    this.showNext();
  }

  private showNext(): void {
    if (this.showing) return;
    const notice = this.waiting.shift();
    if (!notice) return;
    this.showing = true;
    const ref = this.snack.open(notice.message, notice.action, { duration: notice.durationMs, politeness: 'polite' });
    ref.onAction().subscribe(() => {
      if (notice.reportId) void this.router.navigate(['/reports', notice.reportId]);
    });
    ref.afterDismissed().subscribe(() => {
      this.showing = false;
      this.showNext();
    });
  }
}
