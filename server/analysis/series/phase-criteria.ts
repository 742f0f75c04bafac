/**
 * The thresholds a member's phase is named with. Each is a published
 * criterion or a stated rule of ours; the methods text prints them, so a
 * reader can disagree with a number rather than with a black box.
 */
import type { PhaseCriteria } from '../../../shared/series-results.ts';

export const PHASE_CRITERIA: PhaseCriteria = {
  /** D counts as zero when it lies within 2 standard errors of 0 (common practice for "not significant"). */
  mobilitySigmas: 2,
  /**
   * Lindemann: melting when the rms vibration reaches ~0.10–0.15 of the
   * spacing (Lindemann 1910; SCIENCE items 17 and 23, range FROM MEMORY).
   * Below the top of that range reads as solid-like.
   */
  lindemannSolidBelow: 0.15,
  /** Our rule: twice the criterion's top means atoms have left their cages. */
  lindemannFluidAbove: 0.3,
  /**
   * g(r_min)/g(r_max) of the first shell: ≈ 0.14 where LJ liquids turn glassy
   * (Wendt & Abraham, Phys. Rev. Lett. 41, 1244 (1978), FROM MEMORY); crystals
   * lie below, liquids above.
   */
  rdfOrderedBelow: 0.14,
  /** Our rule: a first minimum within 40 % of the peak height leaves almost no shell structure (a gas). */
  rdfGasAbove: 0.4,
  /**
   * n·r₁³ with r₁ the nearest-neighbour distance: LJ liquid at its triple point ≈ 1.0,
   * critical ≈ 0.4 (ρ*_c ≈ 0.32, FROM MEMORY), vapour ≪ 0.3. Our thresholds.
   */
  packingCondensedAbove: 0.6,
  packingDiluteBelow: 0.3,
  /** Density over that of the series' densest condensed member (our rule, from the same LJ ratios). */
  densityCondensedFraction: 0.6,
  densityDiluteFraction: 0.35,
  /**
   * A liquid freezes when its S(q) main peak reaches ≈ 2.85 (Hansen & Verlet,
   * Phys. Rev. 184, 151 (1969), FROM MEMORY).
   */
  structureFactorFreezing: 2.85,
  /** Our rule: a main peak below 1.3 is the weak structure of a gas. */
  structureFactorGasBelow: 1.3,
};
