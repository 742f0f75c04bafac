import { describe, expect, it } from 'vitest';
import { bytesText, formatText, speciesText } from './trajectory-format';

describe('trajectory table text', () => {
  it('when a run has several species, then the most abundant comes first with its count', () => {
    expect(speciesText({ speciesCounts: { O: 64, H: 128 } })).toBe('H 128, O 64');
  });
  it('when the upload was compressed, then the format says how', () => {
    expect(formatText({ format: 'extxyz', compression: 'gzip' })).toBe('Extended XYZ (gzip)');
    expect(formatText({ format: 'pdb', compression: 'none' })).toBe('PDB');
  });
  it('when sizes cross a binary unit, then they switch unit', () => {
    expect(bytesText(512)).toBe('512 B');
    expect(bytesText(3 * 1024 * 1024)).toBe('3.0 MiB');
  });
});
