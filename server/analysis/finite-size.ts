/**
 * Periodic images slow a particle's hydrodynamic self-motion; Yeh & Hummer,
 * J. Phys. Chem. B 108, 15873 (2004) give the correction for a cubic box.
 */
import { BOLTZMANN_J_PER_K } from './constants.ts';

/** Madelung-like constant for a cubic lattice of images (Yeh & Hummer 2004). */
export const YEH_HUMMER_XI_CUBIC = 2.837297;

/** ΔD in m²/s to add to the periodic-box D, for viscosity in Pa·s and box edge in m. */
export function yehHummerCorrectionM2PerS(temperatureK: number, viscosityPaS: number, boxEdgeM: number): number {
  return (YEH_HUMMER_XI_CUBIC * BOLTZMANN_J_PER_K * temperatureK) / (6 * Math.PI * viscosityPaS * boxEdgeM);
}
