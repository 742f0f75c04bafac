/**
 * Unit conversions used at the engine's boundaries. The engine computes in
 * Å, ps, u and K; everything a user sees is converted here, from the CODATA
 * constants, so no factor is typed twice.
 */
import {
  AVOGADRO_PER_MOL,
  BOLTZMANN_J_PER_K,
  CM2_PER_A2,
  ELEMENTARY_CHARGE_C,
  GAS_CONSTANT_J_PER_MOL_K,
  KELVIN_PER_THZ,
  M2_PER_A2,
  MEV_PER_THZ,
  SECOND_PER_PS,
  WAVENUMBER_PER_THZ,
  ATOMIC_MASS_UNIT_KG,
  METRE_PER_ANGSTROM,
} from './constants.ts';

export const thzToWavenumber = (thz: number): number => thz * WAVENUMBER_PER_THZ;
export const wavenumberToThz = (cm1: number): number => cm1 / WAVENUMBER_PER_THZ;
export const thzToMeV = (thz: number): number => thz * MEV_PER_THZ;
export const meVToThz = (mev: number): number => mev / MEV_PER_THZ;
export const thzToKelvin = (thz: number): number => thz * KELVIN_PER_THZ;

/** Diffusion coefficient in the three units the product reports. */
export interface DiffusionUnits {
  a2PerPs: number;
  e9M2PerS: number;
  cm2PerS: number;
}

export function diffusionUnits(a2PerPs: number): DiffusionUnits {
  const m2PerS = (a2PerPs * M2_PER_A2) / SECOND_PER_PS;
  return { a2PerPs, e9M2PerS: m2PerS * 1e9, cm2PerS: (a2PerPs * CM2_PER_A2) / SECOND_PER_PS };
}

/** Activation energy: molar and per-particle forms side by side. */
export function energyFromJPerMol(jPerMol: number): { jPerMol: number; kJPerMol: number; eV: number } {
  return { jPerMol, kJPerMol: jPerMol / 1e3, eV: jPerMol / AVOGADRO_PER_MOL / ELEMENTARY_CHARGE_C };
}

export const jPerMolFromKelvin = (kelvin: number): number => kelvin * GAS_CONSTANT_J_PER_MOL_K;

/** Lennard-Jones reduced units for a given σ (Å), ε/k_B (K) and mass (u). */
export interface ReducedUnits {
  /** τ = σ·√(m/ε) in ps. */
  tauPs: number;
  /** σ²/τ in cm²/s. */
  diffusionCm2PerS: number;
  /** σ²/τ in Å²/ps. */
  diffusionA2PerPs: number;
}

export function lennardJonesReducedUnits(sigmaA: number, epsilonOverKB: number, massU: number): ReducedUnits {
  const epsilonJ = epsilonOverKB * BOLTZMANN_J_PER_K;
  const sigmaM = sigmaA * METRE_PER_ANGSTROM;
  const tauS = sigmaM * Math.sqrt((massU * ATOMIC_MASS_UNIT_KG) / epsilonJ);
  const tauPs = tauS / SECOND_PER_PS;
  return {
    tauPs,
    diffusionCm2PerS: ((sigmaM * sigmaM) / tauS) * 1e4,
    diffusionA2PerPs: (sigmaA * sigmaA) / tauPs,
  };
}
