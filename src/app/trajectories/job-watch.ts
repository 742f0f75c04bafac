import { defer, Observable, repeat, takeWhile, timer } from 'rxjs';
import type { AnalysisRunDto } from '../../../shared/analysis-run';

export const isFinished = (run: Pick<AnalysisRunDto, 'status'>) => ['done', 'failed', 'cancelled'].includes(run.status);

/**
 * Polls a job until it finishes: quickly at first, then backing off to a few
 * seconds, and stops by itself with the finished run as its last value.
 */
export function watchJob(fetch: () => Observable<AnalysisRunDto>, firstDelayMs = 400, maxDelayMs = 3000): Observable<AnalysisRunDto> {
  return defer(fetch).pipe(
    repeat({ delay: (count) => timer(Math.min(maxDelayMs, firstDelayMs * 1.5 ** (count - 1))) }),
    takeWhile((run) => !isFinished(run), true),
  );
}
