import { describe, expect, it } from 'vitest';
import { ELEMENTS, elementOf, elementSymbolOf, guessElement, massOf, UnknownElementError } from '../../../shared/elements.ts';

describe('Element table (IUPAC 2021 conventional weights [FROM MEMORY]; Cordero et al. 2008 radii [FROM MEMORY])', () => {
  it('when H through Kr and the listed heavy elements are looked up, then all are present with a mass, radius and colour', () => {
    const heavy = ['Ag', 'Au', 'Pt', 'Pd', 'I', 'Xe', 'Sn', 'Pb', 'W'];
    for (let z = 1; z <= 36; z++) expect([...ELEMENTS.values()].some((e) => e.atomicNumber === z)).toBe(true);
    for (const s of heavy) expect(ELEMENTS.has(s)).toBe(true);
    for (const e of ELEMENTS.values()) {
      expect(e.massU).toBeGreaterThan(0);
      expect(e.covalentRadiusA).toBeGreaterThan(0.2);
      expect(e.colour).toMatch(/^#[0-9a-f]{6}$/);
    }
  });

  it('when labels such as "Ar1", "OW" or "Na+" are given, then the element is read from the case-exact symbol they start with', () => {
    expect(elementSymbolOf('Ar1')).toBe('Ar');
    expect(elementSymbolOf('OW')).toBe('O');
    expect(elementSymbolOf('Na+')).toBe('Na');
    expect(elementOf('C12').massU).toBeCloseTo(12.011, 3);
  });

  // Atom names in biomolecular files: CA is the α-carbon, NE a side-chain nitrogen (common practice of those files).
  it.each([
    ['Ca', 'Ca', 'exact'], ['O', 'O', 'exact'], ['Cl', 'Cl', 'exact'],
    ['CA', 'C', 'assumed'], ['NE', 'N', 'assumed'], ['C1', 'C', 'assumed'], ['OW', 'O', 'assumed'], ['HW2', 'H', 'assumed'], ['CL', 'C', 'assumed'], ['Ar1', 'Ar', 'assumed'],
    ['ca', null, 'unknown'], ['ar', null, 'unknown'], ['bead', null, 'unknown'], ['1A', null, 'unknown'], ['Qq', null, 'unknown'],
  ])('when the label is "%s", then the element is %s (%s): never a symbol of other case', (label, element, status) => {
    const guess = guessElement(label);
    expect(guess.element).toBe(element);
    expect(guess.status).toBe(status);
    expect(guess.massU).toBe(element ? ELEMENTS.get(element)!.massU : null);
  });

  it('when the label is "CA" or "NE", then its mass is carbon\'s or nitrogen\'s, not calcium\'s or neon\'s', () => {
    expect(massOf('CA')).toBeCloseTo(12.011, 3);
    expect(massOf('NE')).toBeCloseTo(14.007, 3);
    expect(() => massOf('ca')).toThrow(/"ca".*confirm its element or give its mass/);
  });

  it('when a label is unknown, then a clear error names it, unless the user gave a mass', () => {
    expect(() => massOf('Qq')).toThrow(UnknownElementError);
    expect(() => massOf('Qq')).toThrow(/"Qq"/);
    expect(massOf('Qq', { Qq: 72 })).toBe(72);
    expect(massOf('Ar1', { Ar: 39.948 })).toBe(39.948);
    expect(() => massOf('Ar', { Ar: -1 })).toThrow(/positive/);
  });
});
