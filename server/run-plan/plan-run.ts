/**
 * A request for analyses turned into what will actually run, before
 * anything is queued: every default resolved (frame stride for long runs,
 * a g(r) range bounded by the sphere of about a thousand atoms), the frames selected, and the
 * cost estimated and held against the site's limits with advice on how to
 * get under them.
 */
import { analysisParamsSchema, PARAM_LIMITS, type AnalysisKey, type AnalysisParams, type AnalysisParamsInput } from '../../shared/analysis-params.ts';
import { selectFrames, type FrameSelection } from '../../shared/frame-selection.ts';
import { resolvePair } from '../../shared/interaction-model.ts';
import type { RunEstimate } from '../../shared/run-estimate.ts';
import { estimateCost, type CostEstimate, type CostInput } from './cost-estimate.ts';
import { boundedRMaxA, cellWidths, defaultRMaxA, DEFAULT_SPHERE_ATOMS } from './rdf-range.ts';

/** What is known about a trajectory before any frame is read. */
export interface TrajectoryFacts {
  atoms: number;
  frames: number;
  /** Time between frames, ps. */
  framePs: number;
  hasVelocities: boolean;
  /** First frame's cell as lattice-vector rows in Å, or null. */
  cell: ArrayLike<number> | null;
}

export interface CostLimits {
  seconds: number;
  memoryBytes: number;
}

export interface PlannedRun {
  params: AnalysisParams;
  selection: FrameSelection;
  estimate: CostEstimate;
  /** Coordinates the job may hold in memory before it uses a scratch file (undefined: the command line's budget). */
  inMemoryBytes?: number;
}

/** A request that cannot run as asked; the message says why and what to change. */
export class PlanProblem extends Error {
  constructor(message: string, readonly estimate?: RunEstimate) {
    super(message);
    this.name = 'PlanProblem';
  }
}

/** A setting out of bounds once the trajectory's defaults are filled in: refused like a schema error, naming the field. */
export class ParamOutOfBounds extends PlanProblem {
  constructor(readonly field: string, readonly detail: string) {
    super(`${field}: ${detail}`);
    this.name = 'ParamOutOfBounds';
  }
}

function costInput(facts: TrajectoryFacts, frames: number, params: AnalysisParams, inMemoryBytes: number | undefined): CostInput {
  const geometry = facts.cell ? cellWidths(facts.cell) : null;
  const cutoffs = params.interactionModel?.pairs.map((p) => resolvePair(p).cutoffA) ?? [];
  return {
    atoms: facts.atoms, frames, hasVelocities: facts.hasVelocities,
    volumePerAtomA3: geometry ? geometry.volume / facts.atoms : null,
    halfWidthA: geometry ? Math.min(...geometry.widths) / 2 : null,
    rMaxA: params.rMaxA ?? null,
    cutoffA: cutoffs.length ? Math.max(...cutoffs) : null,
    inMemoryBytes,
  };
}

/** `inMemoryBytes`: the site's ANALYSIS_IN_MEMORY_BYTES (default: the command line's budget). */
export function planRun(facts: TrajectoryFacts, analyses: readonly AnalysisKey[], paramsInput: AnalysisParamsInput, inMemoryBytes?: number): PlannedRun {
  const params = analysisParamsSchema.parse(paramsInput);
  const selection = selectFrames(facts.frames, facts.framePs, params);
  if ('problem' in selection) throw new PlanProblem(selection.problem);
  // The stride and range the engine will use are recorded with the run.
  params.frameStride = selection.stride;
  if ((analyses.includes('rdf') || analyses.includes('sq')) && params.rMaxA === undefined) {
    const bounded = defaultRMaxA(facts.atoms, facts.cell);
    if (bounded !== undefined) params.rMaxA = Number(bounded.toPrecision(6));
  }
  if (analyses.includes('rdf') || analyses.includes('sq')) checkRdfBins(facts, params);
  return { params, selection, estimate: estimateCost(analyses, costInput(facts, selection.frames, params, inMemoryBytes)), inMemoryBytes };
}

/**
 * The bin limit of g(r) holds for the range actually used: the one given,
 * or else the default (half the shortest cell width), which the schema
 * alone cannot know.
 */
function checkRdfBins(facts: TrajectoryFacts, params: AnalysisParams): void {
  const given = params.rMaxA !== undefined;
  const rMax = params.rMaxA ?? (facts.cell ? Math.min(...cellWidths(facts.cell).widths) / 2 : undefined);
  if (rMax === undefined || !(rMax > 0)) return;
  const bins = Math.round(rMax / params.binWidthA);
  if (bins <= PARAM_LIMITS.maxBins) return;
  const range = given ? `rMaxA ${rMax} Å` : `the default range (half the shortest cell width, ${Number(rMax.toPrecision(6))} Å)`;
  // Rounded up to the next 0.001 Å so the advice itself passes.
  const narrowest = Math.ceil((rMax / PARAM_LIMITS.maxBins) * 1000) / 1000;
  throw new ParamOutOfBounds('binWidthA', `${range} in bins of ${params.binWidthA} Å makes ${bins} bins, more than ${PARAM_LIMITS.maxBins}: use bins of at least ${narrowest} Å or give a shorter rMaxA`);
}

/** x rounded down to `digits` significant digits. */
function floorSignificant(x: number | undefined, digits: number): number | undefined {
  if (x === undefined || !(x > 0)) return undefined;
  const scale = 10 ** (digits - 1 - Math.floor(Math.log10(x)));
  return Math.floor(x * scale) / scale;
}

const within = (e: CostEstimate, limits: CostLimits) => e.seconds <= limits.seconds && e.memoryBytes <= limits.memoryBytes;

/** Ways to bring a run under the limits, each one change on its own, in plain words. */
export function adviceFor(plan: PlannedRun, facts: TrajectoryFacts, analyses: readonly AnalysisKey[], limits: CostLimits): string[] {
  const advice: string[] = [];
  const { selection, params } = plan;
  const span = selection.to - selection.from;
  const at = (frames: number, p: AnalysisParams = params) => estimateCost(analyses, costInput(facts, frames, p, plan.inMemoryBytes));
  for (let factor = 2; factor <= 1_000_000; factor = Math.ceil(factor * 1.5)) {
    const stride = selection.stride * factor;
    const frames = Math.ceil(span / stride);
    if (frames < 2) break;
    if (within(at(frames), limits)) {
      advice.push(`Analyse one frame in ${stride} (frame stride ${stride}): ${frames} frames instead of ${selection.frames}.`);
      break;
    }
  }
  let lo = 2, hi = selection.frames;
  if (within(at(lo), limits)) {
    while (hi - lo > 1) {
      const mid = Math.floor((lo + hi) / 2);
      if (within(at(mid), limits)) lo = mid;
      else hi = mid;
    }
    // No frame numbers: the dialog counts frames from 1 and the API from 0, and this advice reaches both.
    advice.push(`Analyse a shorter frame range: at most ${lo * selection.stride} frames at stride ${selection.stride}.`);
  }
  const rdf = plan.estimate.analyses.find((a) => a.key === 'rdf');
  // Rounded down, so the advised range is never past half the cell.
  const bounded = floorSignificant(boundedRMaxA(facts.atoms, facts.cell), 3);
  const used = params.rMaxA ?? (facts.cell ? Math.min(...cellWidths(facts.cell).widths) / 2 : undefined);
  if (rdf && bounded !== undefined && used !== undefined && used > bounded && rdf.seconds > plan.estimate.seconds / 3) {
    const shorter = at(selection.frames, { ...params, rMaxA: bounded }).analyses.find((a) => a.key === 'rdf')!;
    const speedup = rdf.seconds / shorter.seconds;
    if (speedup >= 1.5) advice.push(`Use a smaller g(r) range: r_max ≤ ${bounded} Å (about ${DEFAULT_SPHERE_ATOMS} atoms within it) makes g(r) about ${speedup.toFixed(0)}× faster.`);
  }
  const heavy = [...plan.estimate.analyses].sort((a, b) => b.seconds - a.seconds)[0];
  if (heavy && analyses.length > 1 && heavy.seconds > plan.estimate.seconds / 2) {
    advice.push(`Run ${heavy.key} on its own, or leave it out: it is most of the estimate.`);
  }
  return advice;
}

/** The estimate as the API returns it. */
export function describeEstimate(plan: PlannedRun, limits: CostLimits, advice: string[]): RunEstimate {
  const { estimate, selection, params } = plan;
  return {
    seconds: estimate.seconds,
    memoryBytes: estimate.memoryBytes,
    scratchBytes: estimate.scratchBytes,
    analyses: estimate.analyses.map((a) => ({ key: a.key, seconds: a.seconds })),
    frames: { from: selection.from, to: selection.to, stride: selection.stride, used: selection.frames, discarded: selection.discardFrames, autoStride: selection.autoStride },
    rMaxA: params.rMaxA ?? null,
    limits: { seconds: limits.seconds, memoryBytes: limits.memoryBytes },
    withinLimits: within(estimate, limits),
    advice,
  };
}
