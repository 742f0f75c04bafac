import { describe, expect, it } from 'vitest';
import { assumedElementsText, formatText, nameParts, speciesText } from './trajectory-format';

describe('trajectory table text', () => {
  it('when a run has several species, then the most abundant comes first with its count', () => {
    expect(speciesText({ speciesCounts: { O: 64, H: 128 } })).toBe('H 128, O 64');
  });
  it('when inspection assumed elements or found none, then each is listed; exact symbols and confirmed ones are not', () => {
    expect(assumedElementsText({ speciesElements: {
      CA: { element: 'C', massU: 12.011, status: 'assumed' }, NE: { element: 'N', massU: 14.007, status: 'assumed' },
      Ca: { element: 'Ca', massU: 40.078, status: 'exact' }, bead: { element: null, massU: null, status: 'unknown' },
      OW: { element: 'O', massU: 15.999, status: 'confirmed' },
    } })).toBe('CA taken as C, NE as N; no element for bead');
    expect(assumedElementsText({ speciesElements: { Ar: { element: 'Ar', massU: 39.948, status: 'exact' } } })).toBe('');
  });
  it('when the upload was compressed, then the format says how', () => {
    expect(formatText({ format: 'extxyz', compression: 'gzip' })).toBe('Extended XYZ (gzip)');
    expect(formatText({ format: 'pdb', compression: 'none' })).toBe('PDB');
  });
  it('when a name is long, then it may break only after its own separators', () => {
    expect(nameParts('argon-liquid_300K.extxyz')).toEqual(['argon-', 'liquid_', '300K.', 'extxyz']);
    expect(nameParts('run1').join('')).toBe('run1');
  });
});
