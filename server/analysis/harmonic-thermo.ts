/**
 * Harmonic thermodynamics from a density of states g(ν), ∫g dν = number of
 * modes: each mode of frequency ν contributes quantum-oscillator weights in
 * x = hν/(k_B·T), with the classical oscillator beside them. Integration is
 * the trapezoid rule on the given grid.
 *
 * At ν = 0 the heat-capacity and energy weights tend to 1 and are taken as
 * their limits. The entropy weight diverges like −ln x (integrably), so the
 * ν = 0 sample uses its mean over the half bin [0, Δν/2], 2 − ln(x_half),
 * exact to leading order. Diffusive (liquid) modes at ν → 0 are not
 * oscillators; their entropy here is the harmonic value only.
 */
import { AVOGADRO_PER_MOL, BOLTZMANN_J_PER_K, ELEMENTARY_CHARGE_C, GAS_CONSTANT_J_PER_MOL_K, GRAM_PER_AMU, KELVIN_PER_THZ } from './constants.ts';

export interface HarmonicSet {
  /** Isochoric heat capacity per atom in units of k_B. */
  cvPerAtomKB: number;
  cvJPerMolK: number;
  cvJPerGK: number;
  entropyPerAtomKB: number;
  entropyJPerMolK: number;
  /** Vibrational energy per atom relative to the classical minimum, eV. */
  energyPerAtomEV: number;
  /** Zero-point energy per atom, eV (0 classically). */
  zeroPointPerAtomEV: number;
  zeroPointKJPerMol: number;
}

export interface HarmonicThermo {
  temperatureK: number;
  modes: number;
  quantum: HarmonicSet;
  classical: HarmonicSet;
  /** "per mol" means per mole of atoms. */
  basis: 'per mole of atoms';
}

/** Quantum heat-capacity weight x²eˣ/(eˣ−1)², written to stay finite for large x. */
export function cvWeight(x: number): number {
  if (x < 1e-4) return 1 - (x * x) / 12;
  const e = Math.exp(-x);
  const d = 1 - e;
  return (x * x * e) / (d * d);
}

/** Quantum entropy weight x/(eˣ−1) − ln(1−e⁻ˣ). */
export function entropyWeight(x: number): number {
  if (x < 1e-4) return 1 - Math.log(x) + (x * x) / 24;
  return x / Math.expm1(x) - Math.log(-Math.expm1(-x));
}

/** Quantum energy weight in units of k_B·T: x/2 + x/(eˣ−1). */
export function energyWeight(x: number): number {
  if (x < 1e-4) return 1 + (x * x) / 12;
  return x / 2 + x / Math.expm1(x);
}

export function harmonicThermo(freqTHz: ArrayLike<number>, dos: ArrayLike<number>, temperatureK: number, nAtoms: number, totalMassU: number): HarmonicThermo {
  if (!(temperatureK > 0)) throw new Error('Temperature must be positive.');
  const n = freqTHz.length;
  const xPerThz = KELVIN_PER_THZ / temperatureK;
  let modes = 0, cvQ = 0, sQ = 0, eQ = 0, zpe = 0, sC = 0;
  for (let k = 0; k < n; k++) {
    const left = k > 0 ? freqTHz[k] - freqTHz[k - 1] : 0;
    const right = k < n - 1 ? freqTHz[k + 1] - freqTHz[k] : 0;
    const w = 0.5 * (left + right) * dos[k];
    if (w === 0) continue;
    const x = freqTHz[k] * xPerThz;
    modes += w;
    cvQ += w * cvWeight(x);
    eQ += w * energyWeight(x);
    zpe += w * (x / 2);
    if (x === 0) {
      const xHalf = 0.5 * right * xPerThz;
      sQ += w * (2 - Math.log(xHalf));
      sC += w * (2 - Math.log(xHalf));
    } else {
      sQ += w * entropyWeight(x);
      sC += w * (1 - Math.log(x));
    }
  }
  const kT_eV = (BOLTZMANN_J_PER_K * temperatureK) / ELEMENTARY_CHARGE_C;
  const grams = totalMassU * GRAM_PER_AMU;
  const set = (cv: number, s: number, e: number, z: number): HarmonicSet => ({
    cvPerAtomKB: cv / nAtoms,
    cvJPerMolK: (cv / nAtoms) * GAS_CONSTANT_J_PER_MOL_K,
    cvJPerGK: (cv * BOLTZMANN_J_PER_K) / grams,
    entropyPerAtomKB: s / nAtoms,
    entropyJPerMolK: (s / nAtoms) * GAS_CONSTANT_J_PER_MOL_K,
    energyPerAtomEV: (e / nAtoms) * kT_eV,
    zeroPointPerAtomEV: (z / nAtoms) * kT_eV,
    zeroPointKJPerMol: ((z / nAtoms) * kT_eV * ELEMENTARY_CHARGE_C * AVOGADRO_PER_MOL) / 1e3,
  });
  return {
    temperatureK,
    modes,
    quantum: set(cvQ, sQ, eQ, zpe),
    classical: set(modes, sC, modes, 0),
    basis: 'per mole of atoms',
  };
}
