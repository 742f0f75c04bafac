import { switchMap, takeWhile, timer, type Observable } from 'rxjs';
import type { TrajectoryDto } from '../../../shared/trajectory';

/** How often a trajectory still being inspected is looked at again. */
export const INSPECTION_POLL_MS = 3000;

/** Statuses after which the record no longer changes by itself. */
const SETTLED = new Set<TrajectoryDto['status']>(['ready', 'failed']);

/** The trajectory record, fetched again until its inspection has settled. */
export function watchTrajectory(fetch: () => Observable<TrajectoryDto>, pollMs = INSPECTION_POLL_MS): Observable<TrajectoryDto> {
  return timer(0, pollMs).pipe(
    switchMap(() => fetch()),
    takeWhile((t) => !SETTLED.has(t.status), true),
  );
}
