import { describe, expect, it } from 'vitest';
import { clipRange, framesPerRequest, MAX_FRAMES_PER_REQUEST, planRequests, prefetchAhead, VALUES_PER_REQUEST } from './chunk-plan';

describe('framesPerRequest', () => {
  it('when the system is small, then a request carries the most frames allowed', () => {
    expect(framesPerRequest(108)).toBe(MAX_FRAMES_PER_REQUEST);
  });

  it('when the system has 50 000 atoms, then a request stays within the server cap of coordinates', () => {
    const frames = framesPerRequest(50_000);
    expect(frames).toBe(26);
    expect(frames * 50_000 * 3).toBeLessThanOrEqual(VALUES_PER_REQUEST);
  });

  it('when one frame alone exceeds the cap, then a request still asks for one frame', () => {
    expect(framesPerRequest(5_000_000)).toBe(1);
    expect(framesPerRequest(0)).toBe(MAX_FRAMES_PER_REQUEST);
  });
});

describe('prefetchAhead', () => {
  it('when the cache is large, then two requests are prefetched', () => {
    expect(prefetchAhead(50_000, 256 * 2 ** 20)).toBe(52);
  });

  it('when the cache is small for the system, then prefetching is held to a quarter of it', () => {
    // 50 000 atoms → 600 kB a frame; a quarter of 8 MiB holds 3 frames.
    expect(prefetchAhead(50_000, 8 * 2 ** 20)).toBe(3);
    expect(prefetchAhead(100_000_000, 256 * 2 ** 20)).toBe(1);
  });
});

describe('planRequests', () => {
  const missing = (...present: number[]) => (f: number) => !present.includes(f);

  it('when nothing is cached, then the window is cut into requests of at most perRequest frames', () => {
    expect(planRequests({ from: 0, to: 10 }, () => true, 4)).toEqual([{ from: 0, to: 4 }, { from: 4, to: 8 }, { from: 8, to: 10 }]);
  });

  it('when some frames are cached or on their way, then only the gaps are asked for', () => {
    expect(planRequests({ from: 0, to: 10 }, missing(2, 3, 7), 100)).toEqual([{ from: 0, to: 2 }, { from: 4, to: 7 }, { from: 8, to: 10 }]);
  });

  it('when everything is at hand, then nothing is asked for', () => {
    expect(planRequests({ from: 5, to: 9 }, () => false, 4)).toEqual([]);
    expect(planRequests({ from: 5, to: 5 }, () => true, 4)).toEqual([]);
  });
});

describe('clipRange', () => {
  it('when a window runs past either end, then it is clipped to the frames that exist', () => {
    expect(clipRange(-3, 5, 4)).toEqual({ from: 0, to: 4 });
    expect(clipRange(10, 20, 4)).toEqual({ from: 4, to: 4 });
  });
});
