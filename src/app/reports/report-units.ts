import type { DiffusionValue } from '../../../shared/report-summary';

/** The three units a diffusion coefficient is read in, keyed as the summary stores them. */
export type DiffusionUnit = keyof DiffusionValue;

export const DIFFUSION_UNITS: readonly { key: DiffusionUnit; label: string }[] = [
  { key: 'a2PerPs', label: 'Å²/ps' },
  { key: 'e9M2PerS', label: '10⁻⁹ m²/s' },
  { key: 'cm2PerS', label: 'cm²/s' },
];

/** How many of `unit` one Å²/ps is, for curves that carry D in Å²/ps. */
export function perA2PerPs(unit: DiffusionUnit): number {
  return { a2PerPs: 1, e9M2PerS: 10, cm2PerS: 1e-4 }[unit];
}

export function diffusionLabel(unit: DiffusionUnit): string {
  return DIFFUSION_UNITS.find((u) => u.key === unit)!.label;
}

/** Frequency axes of the VDOS: the curve carries all three as columns. */
export type FrequencyUnit = 'thz' | 'cm1' | 'meV';

export const FREQUENCY_UNITS: readonly { key: FrequencyUnit; label: string; column: string }[] = [
  { key: 'thz', label: 'THz', column: 'frequency' },
  { key: 'cm1', label: 'cm⁻¹', column: 'wavenumber' },
  { key: 'meV', label: 'meV', column: 'energy' },
];

export function frequencyUnit(key: FrequencyUnit): { key: FrequencyUnit; label: string; column: string } {
  return FREQUENCY_UNITS.find((u) => u.key === key)!;
}
