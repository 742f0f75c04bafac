import { describe, expect, it } from 'vitest';
import { atomPath } from './atom-path';

const cubic = [10, 0, 0, 0, 10, 0, 0, 0, 10];
const frameOf = (...xyz: number[][]) => Float32Array.from(xyz.flat());

function points(path: Float32Array): number[][] {
  return Array.from({ length: path.length / 3 }, (_, i) => Array.from(path.slice(i * 3, i * 3 + 3)).map((v) => Number(v.toFixed(4))));
}

describe('atomPath', () => {
  it('when the atom moves inside the cell, then the path lists its positions oldest first, ending at the current one', () => {
    // Newest first: frame t, t-1, t-2; atom 1 is the one followed.
    const back = [frameOf([0, 0, 0], [3, 3, 3]), frameOf([0, 0, 0], [2, 2, 2]), frameOf([0, 0, 0], [1, 1, 1])];
    expect(points(atomPath(back, 1, cubic))).toEqual([[1, 1, 1], [2, 2, 2], [3, 3, 3]]);
  });

  it('when the atom wraps across the boundary, then the path continues outside the cell instead of jumping across it', () => {
    const back = [frameOf([0.5, 5, 5]), frameOf([9.5, 5, 5]), frameOf([9, 5, 5])];
    expect(points(atomPath(back, 0, cubic))).toEqual([[-1, 5, 5], [-0.5, 5, 5], [0.5, 5, 5]]);
  });

  it('when there is no cell, then positions are used as they are', () => {
    const back = [frameOf([0.5, 5, 5]), frameOf([9.5, 5, 5])];
    expect(points(atomPath(back, 0, null))).toEqual([[9.5, 5, 5], [0.5, 5, 5]]);
  });

  it('when a frame in between is not at hand, then the path stops there rather than bridging the gap', () => {
    const back = [frameOf([3, 3, 3]), frameOf([2, 2, 2]), undefined, frameOf([0, 0, 0])];
    expect(points(atomPath(back, 0, cubic))).toEqual([[2, 2, 2], [3, 3, 3]]);
    expect(atomPath([undefined], 0, cubic)).toHaveLength(0);
  });
});
