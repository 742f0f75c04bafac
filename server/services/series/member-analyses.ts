/**
 * Which analyses a series member needs, which finished reports already hold
 * them, and which runs are still on their way. A finished report counts when
 * its run was made with the settings the series would use, which are the
 * defaults planned for that run's own set of analyses: a report from the
 * analysis dialog with default settings is reused as well as one the series
 * started itself, and one with a changed fit window or range is not.
 */
import { desc, eq, inArray } from 'drizzle-orm';
import type { AnalysisKey } from '../../../shared/analysis-params.ts';
import type { MemberStatus } from '../../../shared/series-api.ts';
import type { AppContext } from '../../context.ts';
import { analysisRuns, type TrajectoryRow } from '../../db/schema/index.ts';
import { AppError } from '../../errors.ts';
import { planFor } from '../run-costs.ts';

/** What a state-point comparison reads from each member (energy only where the run has energies). */
export const SERIES_ANALYSES: readonly AnalysisKey[] = ['thermo', 'msd', 'vacf', 'vdos', 'rdf', 'sq', 'lindemann'];

type RunRow = typeof analysisRuns.$inferSelect;

export interface MemberPlan {
  needed: AnalysisKey[];
  /** Why nothing can run for this member (not inspected, no time step, too costly…), or null. */
  problem: string | null;
  /** Per needed key, the newest finished report with the series' settings. */
  reportByAnalysis: Partial<Record<AnalysisKey, number>>;
  /** Queued or running runs with the series' settings that hold a key without a report. */
  activeRuns: RunRow[];
  /** Needed keys neither reported nor on their way. */
  missing: AnalysisKey[];
}

/** Key order and whitespace do not make two settings different. */
export function canonicalJson(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(',')}]`;
  if (value && typeof value === 'object') {
    return `{${Object.keys(value).sort().filter((k) => (value as Record<string, unknown>)[k] !== undefined)
      .map((k) => `${JSON.stringify(k)}:${canonicalJson((value as Record<string, unknown>)[k])}`).join(',')}}`;
  }
  return JSON.stringify(value);
}

function messageOf(err: unknown): string {
  return err instanceof Error ? err.message : String(err);
}

/** Energy joins the set when the trajectory has an interaction model (its own or its project's) or energies in its file. */
export async function neededAnalyses(ctx: AppContext, row: TrajectoryRow): Promise<AnalysisKey[]> {
  try {
    await planFor(ctx, row, ['energy'], {});
    return [...SERIES_ANALYSES, 'energy'];
  } catch {
    return [...SERIES_ANALYSES];
  }
}

/**
 * The settings the series would run `analyses` with on this trajectory, as
 * canonical JSON, or the reason they cannot be planned.
 */
export function defaultSettings(ctx: AppContext, row: TrajectoryRow) {
  const cache = new Map<string, Promise<string | { problem: string }>>();
  return (analyses: readonly string[]): Promise<string | { problem: string }> => {
    const key = [...analyses].sort().join(',');
    let planned = cache.get(key);
    if (!planned) {
      planned = planFor(ctx, row, [...analyses] as AnalysisKey[], {})
        .then((c) => canonicalJson(c.plan.params), (err: unknown) => ({ problem: messageOf(err) }));
      cache.set(key, planned);
    }
    return planned;
  };
}

export function trajectoryProblem(row: TrajectoryRow): string | null {
  if (row.status === 'failed') return `${row.name} could not be read: ${row.error ?? 'inspection failed'}.`;
  if (row.status !== 'ready') return null;
  if (!row.timeStep) return `${row.name} states no time between frames: set "Time between frames" in its metadata.`;
  return null;
}

export async function planMember(ctx: AppContext, row: TrajectoryRow): Promise<MemberPlan> {
  const empty = (problem: string | null, needed: AnalysisKey[] = [...SERIES_ANALYSES]): MemberPlan => ({
    needed, problem, reportByAnalysis: {}, activeRuns: [], missing: problem ? [] : needed,
  });
  const problem = trajectoryProblem(row);
  if (problem || row.status !== 'ready') return empty(problem);
  const needed = await neededAnalyses(ctx, row);
  const settings = defaultSettings(ctx, row);
  const wanted = await settings(needed);
  if (typeof wanted !== 'string') return empty(wanted.problem, needed);

  const runs = await ctx.db.select().from(analysisRuns)
    .where(eq(analysisRuns.trajectoryId, row.id)).orderBy(desc(analysisRuns.id)).limit(200);
  const reportByAnalysis: MemberPlan['reportByAnalysis'] = {};
  const activeRuns: RunRow[] = [];
  const covered = new Set<string>();
  const sameSettings = async (run: RunRow) => (await settings(run.analyses)) === canonicalJson(run.params);
  const usefulKeys = (run: RunRow) => run.analyses.filter((k) => (needed as string[]).includes(k) && !covered.has(k));
  // Newest finished report first, then, for keys no report holds, runs on their way.
  for (const run of runs) {
    if (run.status !== 'done' || run.reportId === null) continue;
    const useful = usefulKeys(run);
    if (useful.length === 0 || !(await sameSettings(run))) continue;
    for (const k of useful) (reportByAnalysis[k as AnalysisKey] = run.reportId), covered.add(k);
  }
  for (const run of runs) {
    if (run.status !== 'queued' && run.status !== 'running') continue;
    const useful = usefulKeys(run);
    if (useful.length === 0 || !(await sameSettings(run))) continue;
    activeRuns.push(run);
    for (const k of useful) covered.add(k);
  }
  return { needed, problem: null, reportByAnalysis, activeRuns, missing: needed.filter((k) => !covered.has(k)) };
}

export interface MemberProgress {
  status: MemberStatus;
  progress: number;
  message: string | null;
}

/** A member's state from its plan and the runs the series started for it (newest last). */
export function memberProgress(row: TrajectoryRow, plan: MemberPlan, startedRuns: readonly RunRow[], problem: string | null): MemberProgress {
  if (plan.problem || problem) return { status: 'failed', progress: 0, message: plan.problem ?? problem };
  if (row.status === 'uploading' || row.status === 'inspecting') return { status: 'waiting', progress: 0, message: `${row.name} is being ${row.status === 'uploading' ? 'uploaded' : 'inspected'}; its analyses start once it is ready.` };
  const total = plan.needed.length;
  const done = Object.keys(plan.reportByAnalysis).length;
  if (done === total) return { status: 'done', progress: 100, message: null };
  let partial = 0;
  for (const run of plan.activeRuns) {
    const share = run.analyses.filter((k) => (plan.needed as string[]).includes(k) && !(k in plan.reportByAnalysis)).length;
    partial += (share * run.progress) / 100;
  }
  const progress = Math.min(99, Math.round((100 * (done + partial)) / total));
  if (plan.activeRuns.length) {
    return { status: plan.activeRuns.some((r) => r.status === 'running') ? 'running' : 'queued', progress, message: null };
  }
  const last = startedRuns.at(-1);
  if (last && (last.status === 'failed' || last.status === 'cancelled')) {
    return { status: last.status, progress, message: last.error ?? (last.status === 'failed' ? 'The analysis run failed.' : 'The analysis run was cancelled.') };
  }
  return { status: 'waiting', progress, message: 'Analyses not started yet; they start when a project member opens the series.' };
}

export async function runsByIds(ctx: AppContext, ids: readonly number[]): Promise<Map<number, RunRow>> {
  if (ids.length === 0) return new Map();
  const rows = await ctx.db.select().from(analysisRuns).where(inArray(analysisRuns.id, [...ids]));
  return new Map(rows.map((r) => [r.id, r]));
}

/** An AppError's message as a member problem; anything else is not the user's to fix and goes on up. */
export function problemFrom(err: unknown): string {
  if (err instanceof AppError && err.status < 500) return err.message;
  throw err;
}
