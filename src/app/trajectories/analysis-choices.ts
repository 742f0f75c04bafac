import type { AnalysisKey } from '../../../shared/analysis-params';
import { GUESSED_POTENTIAL_KEYS } from '../../../shared/file-quantities';
import type { TrajectoryDto } from '../../../shared/trajectory';

export interface AnalysisChoice {
  key: AnalysisKey;
  title: string;
  description: string;
}

/** The checklist, in the order a scientist reads a report. */
export const ANALYSIS_CHOICES: AnalysisChoice[] = [
  { key: 'thermo', title: 'Temperature and density', description: 'Kinetic temperature by equipartition, density, block-averaged errors, equilibration check.' },
  { key: 'msd', title: 'MSD and diffusion', description: 'Mean-square displacement over all time origins; D from the Einstein relation with an uncertainty.' },
  { key: 'vacf', title: 'Velocity autocorrelation', description: 'VACF and the running Green–Kubo integral for D.' },
  { key: 'vdos', title: 'Vibrational density of states', description: 'Mass-weighted power spectrum of the velocities, peaks, heat capacity, entropy and zero-point energy.' },
  { key: 'rdf', title: 'Radial distribution g(r)', description: 'Per species pair and total, with the running coordination number.' },
  { key: 'sq', title: 'Structure factor S(q)', description: 'Fourier transform of g(r) with a stated window.' },
  { key: 'lindemann', title: 'Lindemann index', description: 'Relative fluctuation of pair distances; a melting signature.' },
  { key: 'ngp', title: 'Non-Gaussian parameter α₂(t)', description: 'Departure of displacements from a Gaussian; dynamic heterogeneity.' },
  { key: 'energy', title: 'Energy, pressure and heat capacity', description: 'Potential, kinetic and total energy from the interaction model or the file; drift, virial pressure and tensor, heat capacity from fluctuations.' },
];

/** Sensible defaults: what the trajectory can support. */
export function defaultAnalyses(t: Pick<TrajectoryDto, 'cell' | 'boundary' | 'frames'>): AnalysisKey[] {
  const keys: AnalysisKey[] = ['thermo', 'msd', 'vacf', 'vdos'];
  if (t.cell && t.boundary === 'periodic') keys.push('rdf');
  return keys;
}

/** Why an analysis cannot run on this trajectory, or null. */
export function unavailableReason(key: AnalysisKey, t: Pick<TrajectoryDto, 'cell' | 'boundary' | 'frames'> & Partial<Pick<TrajectoryDto, 'interactionModelSource' | 'fileValues' | 'fileQuantities'>>): string | null {
  if (key === 'energy' && t.interactionModelSource === null) {
    const fileEnergy = Boolean(t.fileQuantities?.potentialEnergy || t.fileQuantities?.totalEnergy) || (t.fileValues ?? []).some((k) => (GUESSED_POTENTIAL_KEYS as readonly string[]).includes(k));
    if (!fileEnergy) return 'needs an interaction model (row menu → Interaction model) or energies in the file';
  }
  if ((key === 'rdf' || key === 'sq') && !t.cell) return 'needs a periodic cell, and this file states none';
  if ((key === 'msd' || key === 'vacf' || key === 'vdos' || key === 'ngp') && (t.frames ?? 0) < 3) return 'needs at least 3 frames';
  return null;
}
