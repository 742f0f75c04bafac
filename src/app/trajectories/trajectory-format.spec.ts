import { describe, expect, it } from 'vitest';
import { formatText, nameParts, speciesText } from './trajectory-format';

describe('trajectory table text', () => {
  it('when a run has several species, then the most abundant comes first with its count', () => {
    expect(speciesText({ speciesCounts: { O: 64, H: 128 } })).toBe('H 128, O 64');
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
