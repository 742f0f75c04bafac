/**
 * What a series reads from one member's report summary: the numbers are
 * taken as the report states them, never recomputed, so a member's row in a
 * series always agrees with its own report.
 */
import type { MsdGroupSummary, ReportSummary } from '../../../shared/report-summary.ts';
import type { MemberEnergy } from '../../../shared/series-results.ts';
import { BOLTZMANN_J_PER_K, ELEMENTARY_CHARGE_C } from '../constants.ts';

const KB_EV = BOLTZMANN_J_PER_K / ELEMENTARY_CHARGE_C;

/** The MSD group a series compares: every atom. */
export function diffusionGroup(summary: ReportSummary | null): MsdGroupSummary | null {
  const groups = summary?.msd?.groups ?? [];
  return groups.find((g) => g.label === 'all') ?? groups[0] ?? null;
}

/**
 * The Lindemann ratio a series compares across members: the per-atom
 * displacement form √⟨u²⟩/r_nn, which does not shrink with box size
 * (SCIENCE item 23), when the report has it.
 */
export function lindemannRatio(summary: ReportSummary | null): number | null {
  const l = summary?.lindemann;
  if (!l) return null;
  const ratio = Number.isFinite(l.displacementRatio) ? l.displacementRatio : l.index;
  return Number.isFinite(ratio) ? ratio : null;
}

/**
 * Kinetic energy per atom from the measured temperature: by equipartition
 * KE = (f/2)·k_B·T for f degrees of freedom, shared over N atoms.
 */
export function kineticEnergyPerAtom(summary: ReportSummary | null, atoms: number | null): MemberEnergy | null {
  const thermo = summary?.thermo;
  if (!thermo || !atoms || atoms <= 0) return null;
  const perKelvin = (thermo.degreesOfFreedom / (2 * atoms)) * KB_EV;
  return { eV: perKelvin * thermo.temperatureK.mean, stdError: perKelvin * thermo.temperatureK.stdError, kind: 'kinetic' };
}

/** VDOS harmonic heat capacity with quantum weights, k_B per atom. */
export function harmonicHeatCapacity(summary: ReportSummary | null): number | null {
  const v = summary?.vdos?.cv.quantum.perAtomKB;
  return v !== undefined && Number.isFinite(v) ? v : null;
}
