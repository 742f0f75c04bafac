/**
 * Brings a series up to date: starts the analyses its members still lack
 * (reusing finished and running work with the same settings), reads each
 * member's progress, and recomputes the results when what they are computed
 * from has changed. Reading a series whose members and reports are unchanged
 * costs a few queries; the results are stored.
 */
import { createHash } from 'node:crypto';
import { and, eq } from 'drizzle-orm';
import type { AnalysisKey } from '../../../shared/analysis-params.ts';
import type { SeriesStatus } from '../../../shared/series-api.ts';
import type { SeriesResults } from '../../../shared/series-results.ts';
import { ENGINE_VERSION } from '../../analysis/index.ts';
import { seriesResults } from '../../analysis/series/series-results.ts';
import type { AppContext } from '../../context.ts';
import { analysisRuns, series, seriesMembers } from '../../db/schema/index.ts';
import { startRun } from '../analysis-runs.ts';
import { curveReader, memberInput, reportRows } from './member-inputs.ts';
import { memberProgress, planMember, problemFrom, runsByIds, type MemberPlan, type MemberProgress } from './member-analyses.ts';
import { memberRows, seriesRow, type MemberRow, type SeriesRow } from './series-rows.ts';

type RunRow = typeof analysisRuns.$inferSelect;

export interface SyncedMember {
  row: Awaited<ReturnType<typeof memberRows>>[number];
  plan: MemberPlan;
  progress: MemberProgress;
  /** Runs the series started, and runs on their way that it counts on, oldest first. */
  runs: RunRow[];
}

export interface SyncedSeries {
  series: Awaited<ReturnType<typeof seriesRow>>;
  members: SyncedMember[];
  status: SeriesStatus;
  results: SeriesResults | null;
  resultsComputedAt: Date | null;
}

export interface SyncOptions {
  /** Who the runs the series starts are recorded for; null starts none (a reader through a link). */
  requesterId: number | null;
  /** Start again the analyses of members whose last run failed or was cancelled. */
  retryFailed?: boolean;
}

/** One start at a time per trajectory in this process, so two readers of a series do not start the same run twice. */
const starting = new Map<number, Promise<unknown>>();

async function serialised<T>(trajectoryId: number, work: () => Promise<T>): Promise<T> {
  const before = starting.get(trajectoryId) ?? Promise.resolve();
  const mine = before.catch(() => undefined).then(work);
  starting.set(trajectoryId, mine);
  try {
    return await mine;
  } finally {
    if (starting.get(trajectoryId) === mine) starting.delete(trajectoryId);
  }
}

async function syncMember(ctx: AppContext, s: SeriesRow, m: SyncedMember['row'], options: SyncOptions): Promise<SyncedMember> {
  const startedIds = m.runIds ?? [];
  let plan = await planMember(ctx, m.trajectory);
  let problem = options.retryFailed ? null : m.problem;
  let runIds = startedIds;
  const started = await runsByIds(ctx, startedIds);
  const last = startedIds.length ? started.get(startedIds.at(-1)!) : undefined;
  const gaveUp = !options.retryFailed && (problem !== null || (last !== undefined && (last.status === 'failed' || last.status === 'cancelled')));
  if (plan.missing.length && !plan.problem && options.requesterId !== null && !gaveUp && m.trajectory.status === 'ready') {
    const requesterId = options.requesterId;
    ({ plan, problem, runIds } = await serialised(m.trajectory.id, async () => {
      const fresh = await planMember(ctx, m.trajectory);
      if (fresh.missing.length === 0) return { plan: fresh, problem: null, runIds: startedIds };
      try {
        const run = await startRun(ctx, m.trajectory.id, requesterId, fresh.missing, {}, `Started for the series "${s.name}".`);
        return { plan: await planMember(ctx, m.trajectory), problem: null, runIds: [...startedIds, run.id] };
      } catch (err) {
        return { plan: fresh, problem: problemFrom(err), runIds: startedIds };
      }
    }));
  }
  if (problem !== m.problem || runIds !== startedIds) {
    await ctx.db.update(seriesMembers).set({ problem, runIds })
      .where(and(eq(seriesMembers.seriesId, m.seriesId), eq(seriesMembers.trajectoryId, m.trajectoryId)));
  }
  const runMap = await runsByIds(ctx, runIds);
  const ownRuns = runIds.map((id) => runMap.get(id)).filter((r): r is RunRow => r !== undefined);
  const runs = [...ownRuns, ...plan.activeRuns.filter((r) => !runMap.has(r.id))].sort((a, b) => a.id - b.id);
  return { row: { ...m, problem, runIds }, plan, runs, progress: memberProgress(m.trajectory, plan, ownRuns, problem) };
}

export function seriesStatus(members: readonly SyncedMember[]): SeriesStatus {
  const onItsWay = (m: SyncedMember) => m.plan.activeRuns.length > 0 || m.row.trajectory.status === 'uploading' || m.row.trajectory.status === 'inspecting';
  if (members.some(onItsWay)) return 'running';
  return members.every((m) => m.progress.status === 'done') ? 'ready' : 'incomplete';
}

/** What the results are computed from; the same basis gives the same results. */
export function resultsBasis(s: Pick<SeriesRow, 'id'>, members: readonly SyncedMember[]): string {
  const basis = members.map(({ row, plan }) => [
    row.trajectoryId, row.position, row.excludedFromFit, row.branch, row.trajectory.name, row.trajectory.temperatureK,
    Object.entries(plan.reportByAnalysis).sort(([a], [b]) => a.localeCompare(b)),
  ]);
  return createHash('sha256').update(JSON.stringify([ENGINE_VERSION, s.id, basis])).digest('hex');
}

async function computeResults(ctx: AppContext, members: readonly SyncedMember[]): Promise<SeriesResults | null> {
  if (!members.some((m) => Object.keys(m.plan.reportByAnalysis).length > 0)) return null;
  const rows = await reportRows(ctx, members.flatMap((m) => Object.values(m.plan.reportByAnalysis)));
  const curvesOf = curveReader(ctx);
  const inputs = await Promise.all(members.map((m) => memberInput({
    trajectory: m.row.trajectory, position: m.row.position, branch: m.row.branch, excludedFromFit: m.row.excludedFromFit,
    reportByAnalysis: m.plan.reportByAnalysis,
  }, rows, curvesOf)));
  const results = seriesResults(inputs);
  // The engine knows only stated pressures; a run with an energy analysis has its virial pressure.
  for (const [i, member] of results.members.entries()) {
    const energyReport = members[i]!.plan.reportByAnalysis['energy' as AnalysisKey];
    const pressure = energyReport !== undefined ? (rows.get(energyReport)?.summary as { energy?: { pressureBar?: { mean: number; stdError: number } | null } })?.energy?.pressureBar : null;
    if (!member.pressureBar && pressure) member.pressureBar = { value: pressure.mean, stdError: pressure.stdError, source: 'virial' };
  }
  return results;
}

/** The series with its members' progress and current results, starting what is missing when `requesterId` is given. */
export async function syncSeries(ctx: AppContext, id: number, options: SyncOptions): Promise<SyncedSeries> {
  const s = await seriesRow(ctx, id);
  const rows = await memberRows(ctx, id);
  const members: SyncedMember[] = [];
  for (const m of rows) members.push(await syncMember(ctx, s, m, options));
  const basis = resultsBasis(s, members);
  let results = s.results as SeriesResults | null;
  let computedAt = s.resultsComputedAt;
  if (basis !== s.resultsBasis) {
    results = await computeResults(ctx, members);
    computedAt = results ? new Date() : null;
    await ctx.db.update(series).set({ results: results as Record<string, unknown> | null, resultsBasis: basis, resultsComputedAt: computedAt })
      .where(eq(series.id, id));
  }
  return { series: s, members, status: seriesStatus(members), results, resultsComputedAt: computedAt };
}

export type { MemberRow };
