// RunNotices is an injectable, which needs the JIT compiler when loaded outside an Angular build.
import '@angular/compiler';
import { Injector } from '@angular/core';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router } from '@angular/router';
import { Subject } from 'rxjs';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import type { AnalysisRunDto } from '../../../shared/analysis-run';
import { DONE_NOTICE_MS, NOTICE_TURN_MS, RunNotices } from './run-notices';

/** A snack bar that records what it shows and honours `duration` the way the real one does. */
function fakeSnackBar() {
  const shown: { message: string; duration: number | undefined; dismissed: boolean }[] = [];
  const open = vi.fn((message: string, _action: string, config: { duration?: number }) => {
    const entry = { message, duration: config.duration, dismissed: false };
    shown.push(entry);
    const dismissed = new Subject<void>();
    const ref = {
      onAction: () => new Subject<void>(),
      afterDismissed: () => dismissed,
      dismiss: () => {
        if (entry.dismissed) return;
        entry.dismissed = true;
        dismissed.next();
        dismissed.complete();
      },
    };
    if (config.duration) setTimeout(() => ref.dismiss(), config.duration);
    return ref;
  });
  return { snack: { open }, shown, showing: () => shown.filter((s) => !s.dismissed).map((s) => s.message) };
}

const run = (id: number, analyses: string[]) => ({ id, status: 'done', analyses, reportId: 100 + id, error: null }) as unknown as AnalysisRunDto;

describe('notices of finished runs', () => {
  let bar: ReturnType<typeof fakeSnackBar>;
  let notices: RunNotices;
  beforeEach(() => {
    vi.useFakeTimers();
    bar = fakeSnackBar();
    const injector = Injector.create({ providers: [
      { provide: MatSnackBar, useValue: bar.snack }, { provide: Router, useValue: { navigate: vi.fn() } }, { provide: RunNotices },
    ] });
    notices = injector.get(RunNotices);
  });
  afterEach(() => vi.useRealTimers());

  it('when one run ends, then its notice stays for a minute, long enough to finish what the user was typing', () => {
    notices.finished(run(1, ['thermo']), 'melt.extxyz');
    vi.advanceTimersByTime(DONE_NOTICE_MS - 1);
    expect(bar.showing()).toEqual(['The analysis of melt.extxyz (temperature) is done.']);
    vi.advanceTimersByTime(1);
    expect(bar.showing()).toEqual([]);
  });

  it('when a second run ends while the first is announced, then the first gives way after its turn and the second stays', () => {
    notices.finished(run(1, ['thermo']), 'melt.extxyz');
    vi.advanceTimersByTime(2000);
    notices.finished(run(2, ['msd']), 'melt.extxyz');
    expect(bar.showing()).toEqual(['The analysis of melt.extxyz (temperature) is done.']);
    vi.advanceTimersByTime(NOTICE_TURN_MS - 2000);
    expect(bar.showing()).toEqual(['The analysis of melt.extxyz (MSD) is done.']);
    vi.advanceTimersByTime(DONE_NOTICE_MS - 1);
    expect(bar.showing()).toEqual(['The analysis of melt.extxyz (MSD) is done.']);
  });

  it('when a failed run is announced, then it stays until closed, unless another notice waits behind it', () => {
    notices.finished({ ...run(1, ['msd']), status: 'failed', error: 'Species "Xe" is not in this trajectory.' }, 'melt.extxyz');
    vi.advanceTimersByTime(10 * DONE_NOTICE_MS);
    expect(bar.showing()).toEqual(['The analysis of melt.extxyz (MSD) failed: Species "Xe" is not in this trajectory.']);
    notices.finished(run(2, ['thermo']), 'melt.extxyz');
    vi.advanceTimersByTime(0);
    expect(bar.showing()).toEqual(['The analysis of melt.extxyz (temperature) is done.']);
  });
});
