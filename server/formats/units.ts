/**
 * Unit tables for assembling a trajectory in engine units (Å, ps, Å/ps).
 * Each factor multiplies a value in the named unit to give the engine unit;
 * physical constants come from the engine's CODATA table, nothing is
 * restated here.
 */
import { ANGSTROM_PER_BOHR, HBAR_J_S, METRE_PER_ANGSTROM, SECOND_PER_PS } from '../analysis/constants.ts';

/** Hartree energy, J (CODATA 2018); defines the atomic unit of time. */
const HARTREE_J = 4.3597447222071e-18;
/** Atomic unit of time ħ/E_h in ps (≈ 2.418884e-5 ps). */
const PS_PER_AU_TIME = HBAR_J_S / HARTREE_J / SECOND_PER_PS;

export const LENGTH_TO_ANGSTROM = {
  angstrom: 1,
  /** 1 nm = 10 Å. */
  nm: 10,
  /** 1 pm = 0.01 Å. */
  pm: 0.01,
  bohr: ANGSTROM_PER_BOHR,
} as const;

export const TIME_TO_PS = {
  fs: 1e-3,
  ps: 1,
  ns: 1e3,
  /** Atomic unit of time, ħ/E_h. */
  au: PS_PER_AU_TIME,
} as const;

export const VELOCITY_TO_ANGSTROM_PER_PS = {
  'angstrom/ps': 1,
  /** 1 Å/fs = 1000 Å/ps. */
  'angstrom/fs': 1e3,
  /** 1 nm/ps = 10 Å/ps. */
  'nm/ps': 10,
  /** 1 m/s = 1e10 Å / 1e12 ps = 0.01 Å/ps. */
  'm/s': SECOND_PER_PS / METRE_PER_ANGSTROM,
  /** Atomic unit of velocity: one bohr per ħ/E_h (≈ 21876.9 Å/ps). */
  'bohr/au': ANGSTROM_PER_BOHR / PS_PER_AU_TIME,
  /** Å per atomic unit of time (used by some ab-initio codes with Å positions). */
  'angstrom/au': 1 / PS_PER_AU_TIME,
} as const;

export type LengthUnit = keyof typeof LENGTH_TO_ANGSTROM;
export type TimeUnit = keyof typeof TIME_TO_PS;
export type VelocityUnit = keyof typeof VELOCITY_TO_ANGSTROM_PER_PS;
