import { defer, of } from 'rxjs';
import { TestScheduler } from 'rxjs/testing';
import { describe, expect, it } from 'vitest';
import type { TrajectoryDto } from '../../../shared/trajectory';
import { watchTrajectory } from './trajectory-watch';

const withStatus = (status: TrajectoryDto['status']) => ({ id: 1, status } as TrajectoryDto);

describe('watchTrajectory', () => {
  it('when the trajectory is still being inspected, then it is fetched again until it is ready, and no more', () => {
    const scheduler = new TestScheduler((actual, expected) => expect(actual).toEqual(expected));
    scheduler.run(({ expectObservable }) => {
      const answers = [withStatus('inspecting'), withStatus('inspecting'), withStatus('ready'), withStatus('ready')];
      let calls = 0;
      const watched = watchTrajectory(() => defer(() => of(answers[calls++]!)), 10);
      expectObservable(watched).toBe('a 9ms b 9ms (c|)', { a: answers[0], b: answers[1], c: answers[2] });
    });
  });

  it('when inspection failed, then the failed record is the last one', () => {
    const scheduler = new TestScheduler((actual, expected) => expect(actual).toEqual(expected));
    scheduler.run(({ expectObservable }) => {
      const failed = withStatus('failed');
      expectObservable(watchTrajectory(() => of(failed), 10)).toBe('(a|)', { a: failed });
    });
  });
});
