/** Member inputs for series tests, built by running the real engine on trajectories with known answers. */
import { runAnalyses } from '../../../server/analysis/index.ts';
import type { SeriesMemberInput } from '../../../server/analysis/series/series-results.ts';
import type { Trajectory } from '../../../server/analysis/trajectory.ts';
import type { MemberEnergy } from '../../../shared/series-results.ts';

export const SERIES_TEST_ANALYSES = ['thermo', 'msd', 'rdf', 'sq', 'lindemann'] as const;

export function memberFromRun(trajectoryId: number, temperatureK: number, traj: Trajectory, totalEnergy: MemberEnergy | null = null): SeriesMemberInput {
  const run = runAnalyses(traj, SERIES_TEST_ANALYSES, {});
  const counts: Record<string, number> = {};
  for (const s of traj.species) counts[s] = (counts[s] ?? 0) + 1;
  return {
    trajectoryId, name: `run-${temperatureK}K`, position: trajectoryId, branch: null, excludedFromFits: false,
    statedTemperatureK: temperatureK, statedPressureBar: null, atoms: traj.nAtoms, speciesCounts: counts,
    summary: run.summary, rdfCurve: run.curves['rdf'] ?? null, totalEnergy,
  };
}
