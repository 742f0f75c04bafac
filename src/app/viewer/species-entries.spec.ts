import { describe, expect, it } from 'vitest';
import { ELEMENTS } from '../../../shared/elements';
import { speciesEntries } from './species-entries';

describe('speciesEntries', () => {
  it('when a system has water, then each species is listed with its atom count, colour and visibility', () => {
    const system = { speciesNames: ['O', 'H'], speciesIndex: Uint16Array.from([0, 1, 1, 0, 1, 1]) };
    expect(speciesEntries(system, new Set([1]))).toEqual([
      { index: 0, name: 'O', count: 2, colour: ELEMENTS.get('O')!.colour, visible: true },
      { index: 1, name: 'H', count: 4, colour: ELEMENTS.get('H')!.colour, visible: false },
    ]);
  });

  it('when the system is not known yet, then the list is empty', () => {
    expect(speciesEntries(null, new Set())).toEqual([]);
  });
});
