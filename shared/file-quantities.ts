/**
 * Which per-frame numbers of a trajectory file are energies, pressure or
 * temperature, and in which unit: extended XYZ comment keys (any numeric
 * key, e.g. energy=-1234.5) and H5MD observables. The metadata form and
 * the analysis both use this schema.
 */
import { z } from 'zod';
import { ENERGY_UNIT_LIST, PRESSURE_UNIT_LIST } from './energy-units.ts';

const key = z.string().trim().min(1, 'name the key').max(64, 'at most 64 characters');

export const fileQuantitiesSchema = z.strictObject({
  /** Potential energy of the whole system. */
  potentialEnergy: z.strictObject({ key, unit: z.enum(ENERGY_UNIT_LIST) }).optional(),
  /** Total (kinetic + potential) energy of the whole system. */
  totalEnergy: z.strictObject({ key, unit: z.enum(ENERGY_UNIT_LIST) }).optional(),
  pressure: z.strictObject({ key, unit: z.enum(PRESSURE_UNIT_LIST) }).optional(),
  /** Temperature in K. */
  temperature: z.strictObject({ key }).optional(),
});

export type FileQuantities = z.infer<typeof fileQuantitiesSchema>;
export const FILE_QUANTITY_LABELS: Record<keyof FileQuantities, string> = {
  potentialEnergy: 'potential energy', totalEnergy: 'total energy', pressure: 'pressure', temperature: 'temperature',
};

/** Keys that, unmapped, are read as the potential energy in eV: the extended XYZ habit. Said as a guess in the report. */
export const GUESSED_POTENTIAL_KEYS = ['energy', 'potential_energy', 'epot'] as const;
