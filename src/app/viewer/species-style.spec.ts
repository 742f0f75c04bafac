import { describe, expect, it } from 'vitest';
import { ELEMENTS } from '../../../shared/elements';
import { speciesStyle } from './species-style';

describe('speciesStyle', () => {
  it('when a label names an element, then its colour and covalent radius come from the shared table', () => {
    expect(speciesStyle('OW')).toEqual({ colour: ELEMENTS.get('O')!.colour, radiusA: ELEMENTS.get('O')!.covalentRadiusA, known: true });
    expect(speciesStyle('Ar1').radiusA).toBe(ELEMENTS.get('Ar')!.covalentRadiusA);
  });

  it('when a label names no element, then a neutral stand-in is used', () => {
    expect(speciesStyle('Q7')).toMatchObject({ radiusA: 1, known: false });
  });
});
