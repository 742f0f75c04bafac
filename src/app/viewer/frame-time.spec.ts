import { describe, expect, it } from 'vitest';
import { frameTimePs } from './frame-time';

describe('frameTimePs', () => {
  it('when the file states a time, then it is converted to ps', () => {
    expect(frameTimePs({ index: 3, time: 250 }, null, 'fs')).toBeCloseTo(0.25, 12);
    expect(frameTimePs({ index: 3, time: 2 }, 99, 'ns')).toBe(2000);
  });

  it('when the file states no time, then the index times the time between frames is used, or nothing', () => {
    expect(frameTimePs({ index: 4, time: null }, 0.5, 'ps')).toBe(2);
    expect(frameTimePs({ index: 4, time: null }, null, 'ps')).toBeNull();
    expect(frameTimePs({ index: 4, time: 1 }, null, 'fortnights')).toBeNull();
  });
});
