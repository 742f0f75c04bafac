import { describe, expect, it } from 'vitest';
import { atomsBySpecies, gatherPositions } from './species-positions';

describe('species positions', () => {
  it('when a species is gathered, then its atoms come out in list order', () => {
    const positions = Float32Array.from([0, 0, 0, 0, 0, 5, 0.9, 0, 0, 0, 0, -20]);
    const target = new Float32Array(6);
    gatherPositions(target, Uint32Array.from([3, 1]), positions);
    expect(Array.from(target)).toEqual([0, 0, -20, 0, 0, 5]);
  });

  it('when atoms are grouped by species, then each list holds its atoms in order', () => {
    const lists = atomsBySpecies(Uint16Array.from([1, 0, 1, 2, 1]), 3);
    expect(lists.map((l) => Array.from(l))).toEqual([[1], [0, 2, 4], [3]]);
  });
});
