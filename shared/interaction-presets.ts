/**
 * Published parameter sets offered as starting points in the model editor.
 * Each names its source and says how sure we are of it: "confirmed" where the
 * value was checked against stored public text, "from memory" otherwise
 * (check before relying on it). Cut-off choices are ours and said as such.
 */
import type { InteractionModelInput } from './interaction-model.ts';

export interface InteractionPreset {
  id: string;
  name: string;
  description: string;
  source: string;
  sourceStatus: 'confirmed' | 'from memory';
  model: InteractionModelInput;
}

export const INTERACTION_PRESETS: InteractionPreset[] = [
  {
    id: 'argon-lj-rnp',
    name: 'Argon, Lennard-Jones 12-6 (σ = 3.405 Å, ε/k_B = 119.8 K)',
    description: 'Cut-off 3σ = 10.215 Å, truncated, with analytic tail corrections (our choice of cut-off; change it to match your run).',
    source: 'L. A. Rowley, D. Nicholson & N. G. Parsonage, J. Comput. Phys. 17, 401 (1975); values confirmed on the SklogWiki "Argon" page, journal reference from memory',
    sourceStatus: 'confirmed',
    model: {
      name: 'Argon, LJ 12-6 (Rowley–Nicholson–Parsonage)',
      source: 'Rowley, Nicholson & Parsonage, J. Comput. Phys. 17, 401 (1975)',
      pairs: [{ species: ['Ar', 'Ar'], form: 'lj', epsilonK: 119.8, sigmaA: 3.405, cutoffA: 10.215, truncation: 'truncated', tailCorrection: true }],
    },
  },
  {
    id: 'argon-lj-rahman',
    name: 'Argon, Lennard-Jones 12-6 (σ = 3.4 Å, ε/k_B = 120 K)',
    description: 'The parameters of the first liquid-argon MD study. Cut-off 2.5σ = 8.5 Å, shifted (our choice).',
    source: 'A. Rahman, Phys. Rev. 136, A405 (1964); σ and ε/k_B confirmed via a secondary article quoting the paper',
    sourceStatus: 'confirmed',
    model: {
      name: 'Argon, LJ 12-6 (Rahman 1964)',
      source: 'Rahman, Phys. Rev. 136, A405 (1964)',
      pairs: [{ species: ['Ar', 'Ar'], form: 'lj', epsilonK: 120, sigmaA: 3.4, cutoffA: 8.5, truncation: 'shifted' }],
    },
  },
  {
    id: 'copper-morse-gw',
    name: 'Copper, Morse (D = 0.3429 eV, α = 1.3588 Å⁻¹, r₀ = 2.866 Å)',
    description: 'A pair-only model of a metal: fine for teaching and checks, not for defect or surface energetics. Cut-off 9 Å, shifted (our choice).',
    source: 'L. A. Girifalco & V. G. Weizer, Phys. Rev. 114, 687 (1959); parameters from memory, not checked here',
    sourceStatus: 'from memory',
    model: {
      name: 'Copper, Morse (Girifalco–Weizer)',
      source: 'Girifalco & Weizer, Phys. Rev. 114, 687 (1959) — parameters from memory',
      pairs: [{ species: ['Cu', 'Cu'], form: 'morse', depthEV: 0.3429, alphaPerA: 1.3588, r0A: 2.866, cutoffA: 9, truncation: 'shifted' }],
    },
  },
];
