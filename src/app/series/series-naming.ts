import type { TrajectoryDto } from '../../../shared/trajectory';

/** Coldest first by stated temperature; runs without one keep their order at the end. */
export function temperatureOrder(trajectories: readonly TrajectoryDto[]): TrajectoryDto[] {
  return trajectories
    .map((t, i) => ({ t, i }))
    .sort((a, b) => (a.t.temperatureK ?? Infinity) - (b.t.temperatureK ?? Infinity) || a.i - b.i)
    .map(({ t }) => t);
}

/** A first name for a series: the species and the stated temperature range, when the runs say them. */
export function suggestedSeriesName(ordered: readonly TrajectoryDto[]): string {
  const species = [...new Set(ordered.flatMap((t) => Object.keys(t.speciesCounts ?? {})))].sort();
  const temps = ordered.map((t) => t.temperatureK).filter((t): t is number => t !== null);
  const what = species.length ? species.join('–') : 'Runs';
  if (temps.length < 2) return `${what} series`;
  return `${what} from ${Math.min(...temps)} to ${Math.max(...temps)} K`;
}
