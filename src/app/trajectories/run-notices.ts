import { inject, Injectable } from '@angular/core';
import { MatSnackBar, type MatSnackBarRef, type TextOnlySnackBar } from '@angular/material/snack-bar';
import { Router } from '@angular/router';
import type { AnalysisRunDto } from '../../../shared/analysis-run';
import { analysesText } from '../../../shared/analysis-labels';

/** How long a finished run's notice stays when nothing waits behind it: long enough to finish a sentence elsewhere first. */
export const DONE_NOTICE_MS = 60_000;
/** How long any notice shows before it gives way to one waiting behind it. */
export const NOTICE_TURN_MS = 10_000;

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
  private showing: { ref: MatSnackBarRef<TextOnlySnackBar>; shownAt: number } | null = null;
  private givingWay: ReturnType<typeof setTimeout> | null = null;

  finished(run: AnalysisRunDto, trajectoryName: string): void {
    const what = `The analysis of ${trajectoryName} (${analysesText(run.analyses)})`;
    if (run.status === 'done') {
      this.waiting.push({ message: `${what} is done.`, action: 'Open report', reportId: run.reportId, durationMs: DONE_NOTICE_MS });
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
    if (this.showing) {
      this.giveWayAfterTurn();
      return;
    }
    const notice = this.waiting.shift();
    if (!notice) return;
    const ref = this.snack.open(notice.message, notice.action, { duration: notice.durationMs, politeness: 'polite' });
    this.showing = { ref, shownAt: Date.now() };
    ref.onAction().subscribe(() => {
      if (notice.reportId) void this.router.navigate(['/reports', notice.reportId]);
    });
    ref.afterDismissed().subscribe(() => {
      if (this.givingWay) clearTimeout(this.givingWay);
      this.givingWay = null;
      this.showing = null;
      this.showNext();
    });
    if (this.waiting.length) this.giveWayAfterTurn();
  }

  /** A notice with another waiting behind it is dismissed once it has had its turn, so none waits a minute or for ever. */
  private giveWayAfterTurn(): void {
    const showing = this.showing;
    if (!showing || this.givingWay) return;
    this.givingWay = setTimeout(() => showing.ref.dismiss(), Math.max(0, showing.shownAt + NOTICE_TURN_MS - Date.now()));
  }
}
