import { describe, expect, it } from 'vitest';
import { DIFFUSION_UNITS, diffusionLabel, FREQUENCY_UNITS, perA2PerPs } from './report-units';

describe('diffusion units', () => {
  it('when Å²/ps is converted, then 1 Å²/ps = 10⁻⁸ m²/s = 10 × 10⁻⁹ m²/s = 10⁻⁴ cm²/s', () => {
    expect(perA2PerPs('a2PerPs')).toBe(1);
    expect(perA2PerPs('e9M2PerS')).toBe(10);
    expect(perA2PerPs('cm2PerS')).toBe(1e-4);
  });

  it('when the switch lists its units, then each has its own label', () => {
    expect(DIFFUSION_UNITS.map((u) => diffusionLabel(u.key))).toEqual(['Å²/ps', '10⁻⁹ m²/s', 'cm²/s']);
  });

  it('when the VDOS axis is switched, then each unit reads its own column of the curve', () => {
    expect(FREQUENCY_UNITS.map((u) => u.column)).toEqual(['frequency', 'wavenumber', 'energy']);
  });
});
