/**
 * The cost of a run before it is queued: the plan (defaults resolved,
 * frames selected), its estimate against the site's limits, and the advice
 * that goes with a refusal.
 */
import type { AnalysisKey, AnalysisParamsInput } from '../../shared/analysis-params.ts';
import type { RunEstimate } from '../../shared/run-estimate.ts';
import type { AppContext } from '../context.ts';
import type { TrajectoryRow } from '../db/schema/index.ts';
import { AppError, conflict } from '../errors.ts';
import { LENGTH_TO_ANGSTROM, TIME_TO_PS, type LengthUnit, type TimeUnit } from '../formats/units.ts';
import { adviceFor, describeEstimate, ParamOutOfBounds, planRun, PlanProblem, type CostLimits, type PlannedRun, type TrajectoryFacts } from '../run-plan/plan-run.ts';
import { massesToFill, speciesElementsOf } from '../../shared/trajectory.ts';
import { energyInputs } from './interaction-models.ts';
import { getTrajectoryRow } from './trajectories.ts';

export function trajectoryFacts(row: TrajectoryRow): TrajectoryFacts {
  const toAngstrom = LENGTH_TO_ANGSTROM[row.lengthUnit as LengthUnit] ?? 1;
  return {
    atoms: row.atoms ?? 0, frames: row.frames ?? 0, hasVelocities: row.hasVelocities ?? false,
    framePs: (row.timeStep ?? 0) * (TIME_TO_PS[row.timeUnit as TimeUnit] ?? 1),
    cell: row.cell ? row.cell.map((v) => v * toAngstrom) : null,
  };
}

export function costLimits(ctx: AppContext): CostLimits {
  return { seconds: ctx.config.ANALYSIS_MAX_SECONDS, memoryBytes: ctx.config.ANALYSIS_MAX_MEMORY_BYTES };
}

export interface CostedPlan {
  plan: PlannedRun;
  estimate: RunEstimate;
}

/** Plans a run on a ready trajectory; a setting out of bounds is a 400 and a selection that cannot work a 422, each naming the field. */
export async function planFor(ctx: AppContext, row: TrajectoryRow, analyses: AnalysisKey[], paramsInput: AnalysisParamsInput): Promise<CostedPlan> {
  if (row.status !== 'ready') throw conflict(`The trajectory is ${row.status}; analyses can start once it is ready.`);
  if (!row.timeStep) throw conflict(`${row.name} states no time between frames: set "Time between frames" in its metadata first.`);
  // The energy analysis takes the stored model, file keys and ensemble unless the request names its own.
  const energy = analyses.includes('energy') ? await energyInputs(ctx, row, paramsInput as Record<string, unknown>) : {};
  const masses = speciesMasses(row, analyses, paramsInput.masses ?? {});
  const facts = trajectoryFacts(row);
  let plan: PlannedRun;
  try {
    plan = planRun(facts, analyses, { ...paramsInput, ...energy, ...(masses ? { masses } : {}) }, ctx.config.ANALYSIS_IN_MEMORY_BYTES);
  } catch (err) {
    // Like a schema refusal: 400 naming the field.
    if (err instanceof ParamOutOfBounds) throw new AppError(400, 'invalid_input', err.message, [{ field: err.field, message: err.detail }]);
    if (err instanceof PlanProblem) throw new AppError(422, 'invalid_selection', err.message);
    throw err;
  }
  const limits = costLimits(ctx);
  const estimate = describeEstimate(plan, limits, []);
  if (!estimate.withinLimits) estimate.advice = adviceFor(plan, facts, analyses, limits);
  return { plan, estimate };
}

/** Analyses that weigh atoms by mass (all but the structural ones). */
const MASS_FREE: readonly AnalysisKey[] = ['rdf', 'sq'];

/**
 * The masses a run is told, recorded in its parameters: the user's confirmed
 * species → element answers where they differ from what the labels alone
 * give, beside the masses the request names. A species with neither an
 * element nor a mass refuses the run (422) before anything is queued.
 */
function speciesMasses(row: TrajectoryRow, analyses: readonly AnalysisKey[], given: Readonly<Record<string, number>>): Record<string, number> | null {
  const elements = speciesElementsOf(Object.keys(row.speciesCounts ?? {}), row.speciesElements);
  if (analyses.every((a) => MASS_FREE.includes(a))) return null;
  const missing = Object.entries(elements).filter(([label, e]) => e.massU === null && given[label] === undefined).map(([label]) => `"${label}"`);
  if (missing.length) {
    throw new AppError(422, 'unknown_element', `In ${row.name}, species ${missing.join(', ')} ${missing.length > 1 ? 'name' : 'names'} no element (no element symbol, case and all, starts the label): confirm the element or give the mass in the trajectory's metadata, or give "masses" in the run settings.`);
  }
  const filled = massesToFill(elements, given);
  return Object.keys(filled).length ? { ...filled, ...given } : null;
}

/** What a run would cost, without starting it. */
export async function estimateRun(ctx: AppContext, trajectoryId: number, analyses: AnalysisKey[], paramsInput: AnalysisParamsInput): Promise<RunEstimate> {
  return (await planFor(ctx, await getTrajectoryRow(ctx, trajectoryId), analyses, paramsInput)).estimate;
}

/** Refuses, before anything is queued, a run past the site's limits. */
export function assertAffordable({ estimate }: CostedPlan): void {
  if (estimate.withinLimits) return;
  const over = [
    estimate.seconds > estimate.limits.seconds ? `about ${formatSeconds(estimate.seconds)} of work (the limit is ${formatSeconds(estimate.limits.seconds)})` : null,
    estimate.memoryBytes > estimate.limits.memoryBytes ? `about ${formatBytes(estimate.memoryBytes)} of memory (the limit is ${formatBytes(estimate.limits.memoryBytes)})` : null,
  ].filter(Boolean).join(' and ');
  const advice = estimate.advice.length ? ` ${estimate.advice.join(' ')}` : '';
  throw new AppError(422, 'too_costly', `This run would take ${over}, so it was not started.${advice}`, { estimate });
}

export function formatSeconds(s: number): string {
  if (s < 90) return `${Math.max(1, Math.round(s))} s`;
  if (s < 5400) return `${Math.round(s / 60)} min`;
  return `${(s / 3600).toFixed(1)} h`;
}

export function formatBytes(b: number): string {
  return b >= 1024 ** 3 ? `${(b / 1024 ** 3).toFixed(1)} GiB` : `${Math.round(b / 1024 ** 2)} MiB`;
}
