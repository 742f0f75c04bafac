import { Observable, Subject, throwError } from 'rxjs';
import { describe, expect, it } from 'vitest';
import type { FrameRange } from './chunk-plan';
import { FrameSource, type FetchFrames } from './frame-source';
import type { FramesPayload } from './frames-payload-decoder';

const ATOMS = 2;

function payload(from: number, to: number): FramesPayload {
  return {
    atoms: ATOMS, speciesNames: ['Ar'], speciesIndex: new Uint16Array(ATOMS),
    frames: Array.from({ length: to - from }, (_, k) => ({ index: from + k, time: null, cell: null, positions: new Float32Array(ATOMS * 3).fill(from + k) })),
  };
}

/** A frames API whose answers the test releases by hand. */
class ManualFetch {
  readonly calls: { range: FrameRange; answer: Subject<FramesPayload>; answered: boolean; cancelled: boolean }[] = [];
  readonly fetch: FetchFrames = (range) => {
    const answer = new Subject<FramesPayload>();
    const call = { range, answer, answered: false, cancelled: false };
    this.calls.push(call);
    return new Observable<FramesPayload>((subscriber) => {
      const sub = answer.subscribe(subscriber);
      return () => {
        if (!call.answered) call.cancelled = true;
        sub.unsubscribe();
      };
    });
  };

  answer(k: number, to = this.calls[k]!.range.to): void {
    const call = this.calls[k]!;
    call.answered = true;
    call.answer.next(payload(call.range.from, to));
    call.answer.complete();
  }
}

const options = { total: 1000, atoms: ATOMS, cacheBytes: 1 << 20 };

describe('FrameSource', () => {
  it('when frames are wanted, then missing ones are requested in chunks, two at a time, and served from the cache after', () => {
    const api = new ManualFetch();
    const source = new FrameSource(api.fetch, options);

    source.want({ from: 0, to: 600 });
    // The very first request carries one frame so that something is on screen soonest.
    expect(api.calls.map((c) => c.range)).toEqual([{ from: 0, to: 1 }, { from: 1, to: 256 }]);

    api.answer(0);
    api.answer(1);
    expect(api.calls.map((c) => c.range)).toEqual([{ from: 0, to: 1 }, { from: 1, to: 256 }, { from: 256, to: 512 }, { from: 512, to: 600 }]);
    expect(source.frame(10)?.positions[0]).toBe(10);
    expect(source.has(300)).toBe(false);
  });

  it('when the server answers with fewer frames than asked, then the rest is asked for next', () => {
    const api = new ManualFetch();
    const source = new FrameSource(api.fetch, { ...options, maxConcurrent: 1 });
    source.want({ from: 0, to: 100 });
    api.answer(0);
    api.answer(1, 40);
    expect(api.calls[2]!.range).toEqual({ from: 40, to: 100 });
    expect(source.has(39)).toBe(true);
  });

  it('when several ranges are wanted, then the first is asked for first', () => {
    const api = new ManualFetch();
    const source = new FrameSource(api.fetch, { ...options, maxConcurrent: 1 });
    source.want({ from: 50, to: 60 }, { from: 40, to: 50 });
    expect(api.calls.map((c) => c.range)).toEqual([{ from: 50, to: 51 }]);
    api.answer(0);
    api.answer(1);
    expect(api.calls[2]!.range).toEqual({ from: 40, to: 50 });
  });

  it('when the playhead jumps away, then requests for frames no longer wanted are cancelled', () => {
    const api = new ManualFetch();
    const source = new FrameSource(api.fetch, options);
    source.want({ from: 0, to: 10 });
    source.want({ from: 500, to: 510 });
    expect(api.calls[0]!.cancelled).toBe(true);
    expect(api.calls[1]!.cancelled).toBe(true);
    expect(api.calls[2]!.range).toEqual({ from: 500, to: 501 });
  });

  it('when a request fails, then the failure is reported and nothing more is asked until retry', () => {
    const failures: unknown[] = [];
    let calls = 0;
    const source = new FrameSource(() => {
      calls++;
      return throwError(() => new Error('storage is down'));
    }, options);
    source.failed$.subscribe((e) => failures.push(e));

    source.want({ from: 0, to: 10 });
    source.want({ from: 0, to: 10 });
    expect(calls).toBe(1);
    expect(failures).toHaveLength(1);

    source.retry();
    expect(calls).toBe(2);
  });

  it('when an answer lacks the first frame asked for, then it counts as a failure rather than a loop of requests', () => {
    const api = new ManualFetch();
    const source = new FrameSource(api.fetch, options);
    const failures: unknown[] = [];
    source.failed$.subscribe((e) => failures.push(e));
    source.want({ from: 0, to: 10 });
    const asked = api.calls.length;
    api.answer(0, 0);
    expect(String(failures[0])).toMatch(/no data for frame 1/);
    source.want({ from: 0, to: 10 });
    expect(api.calls).toHaveLength(asked);
  });

  it('when the cache budget is small, then old frames are evicted and the bytes stay bounded', () => {
    const api = new ManualFetch();
    const frameBytes = ATOMS * 3 * 4;
    const source = new FrameSource(api.fetch, { ...options, cacheBytes: 50 * frameBytes });
    source.want({ from: 0, to: 200 });
    api.answer(0);
    api.answer(1);
    expect(source.cachedBytes).toBeLessThanOrEqual(50 * frameBytes);
    expect(source.has(199)).toBe(true);
    expect(source.has(0)).toBe(false);
  });

  it('when disposed, then pending requests are cancelled', () => {
    const api = new ManualFetch();
    const source = new FrameSource(api.fetch, options);
    source.want({ from: 0, to: 10 });
    source.dispose();
    expect(api.calls[0]!.cancelled).toBe(true);
  });
});
