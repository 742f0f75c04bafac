/**
 * Series of runs (state-point studies): create, list, read, change, delete.
 * A series is an ordered set of trajectories of one system in one project;
 * its members' analyses run as ordinary analysis runs and its results are
 * derived from their reports (series-sync.ts).
 */
import { and, desc, eq, inArray, sql } from 'drizzle-orm';
import type { CreateSeries, PatchSeries, SeriesDto, SeriesListItem, SeriesMemberDto } from '../../../shared/series-api.ts';
import { SERIES_MIN_MEMBERS } from '../../../shared/series-api.ts';
import type { SeriesResults } from '../../../shared/series-results.ts';
import { SIMULATION_CAUTION } from '../../../shared/simulation-caution.ts';
import type { AppContext } from '../../context.ts';
import { projectMembers, series, seriesMembers, users, type ProjectRole } from '../../db/schema/index.ts';
import { recordAudit } from '../audit.ts';
import { touchProject } from '../trajectories.ts';
import { methodsText } from './series-methods.ts';
import { checkedTrajectories, invalidField, memberRows, seriesRow } from './series-rows.ts';
import { syncSeries, type SyncedSeries } from './series-sync.ts';

function headline(s: { id: number; projectId: number; name: string; createdBy: number; creatorName: string; createdAt: Date; updatedAt: Date },
  status: SeriesListItem['status'], memberCount: number, results: SeriesResults | null): SeriesListItem {
  const temperatures = (results?.members ?? []).map((m) => m.temperatureK).filter((t): t is number => t !== null);
  const fit = results?.arrhenius.activationEnergy ?? null;
  const melting = results?.melting.brackets[0];
  return {
    id: s.id, projectId: s.projectId, name: s.name, status, memberCount,
    temperatureRangeK: temperatures.length ? { min: Math.min(...temperatures), max: Math.max(...temperatures) } : null,
    activationEnergy: fit ? { kJPerMol: fit.kJPerMol, kJPerMolStdError: results?.arrhenius.activationEnergyStdError?.kJPerMol ?? null } : null,
    meltingBracketK: melting?.below && melting.above && !melting.overlap ? { belowK: melting.below.temperatureK, aboveK: melting.above.temperatureK } : null,
    createdBy: { id: s.createdBy, displayName: s.creatorName }, createdAt: s.createdAt.toISOString(), updatedAt: s.updatedAt.toISOString(),
  };
}

export function toSeriesDto(synced: SyncedSeries): SeriesDto {
  const { series: s, members, status, results } = synced;
  const resultOf = new Map((results?.members ?? []).map((m) => [m.trajectoryId, m]));
  const memberDtos: SeriesMemberDto[] = members.map(({ row, plan, progress, runs }) => {
    const r = resultOf.get(row.trajectoryId);
    return {
      trajectoryId: row.trajectoryId, trajectoryName: row.trajectory.name, position: row.position, branch: row.branch, excludedFromFit: row.excludedFromFit,
      statedTemperatureK: row.trajectory.temperatureK, measuredTemperatureK: r?.measuredTemperatureK ?? null,
      densityGPerCm3: r?.densityGPerCm3 ?? null, pressureBar: r?.pressureBar ?? null, atoms: row.trajectory.atoms,
      analyses: plan.needed, status: progress.status, progress: progress.progress, message: progress.message,
      runs: runs.map((run) => ({ id: run.id, analyses: run.analyses, status: run.status, progress: run.progress, reportId: run.reportId, error: run.error })),
      reportIds: [...new Set(Object.values(plan.reportByAnalysis))].sort((a, b) => a - b),
      reportByAnalysis: { ...plan.reportByAnalysis } as Record<string, number>,
    };
  });
  return {
    ...headline(s, status, members.length, results),
    members: memberDtos, results, resultsComputedAt: synced.resultsComputedAt?.toISOString() ?? null,
    methods: methodsText(members, results), caution: SIMULATION_CAUTION,
  };
}

/**
 * Who the runs a project member's read starts are recorded for: the reader
 * when they may start analyses, else the series' creator while they still
 * may; else nobody, and nothing starts.
 */
export async function starterFor(ctx: AppContext, seriesId: number, reader: { id: number; role: ProjectRole }): Promise<number | null> {
  if (reader.role !== 'viewer') return reader.id;
  const { projectId, createdBy } = await seriesRow(ctx, seriesId);
  const [membership] = await ctx.db.select({ role: projectMembers.role }).from(projectMembers)
    .where(and(eq(projectMembers.projectId, projectId), eq(projectMembers.userId, createdBy)));
  return membership && membership.role !== 'viewer' ? createdBy : null;
}

/** The series for a project member; `reader` starts the members' missing analyses (see starterFor). */
export async function getSeries(ctx: AppContext, id: number, reader: { id: number; role: ProjectRole }): Promise<SeriesDto> {
  return toSeriesDto(await syncSeries(ctx, id, { requesterId: await starterFor(ctx, id, reader) }));
}

/** The series as a link holder reads it: starts nothing and names nobody. */
export async function getLinkedSeries(ctx: AppContext, id: number): Promise<SeriesDto> {
  return { ...toSeriesDto(await syncSeries(ctx, id, { requesterId: null })), createdBy: null };
}

export async function createSeries(ctx: AppContext, projectId: number, userId: number, input: CreateSeries): Promise<SeriesDto> {
  await checkedTrajectories(ctx, projectId, input.trajectoryIds, 'trajectoryIds');
  const id = await ctx.db.transaction(async (tx) => {
    const [{ id: seriesId }] = await tx.insert(series).values({ projectId, name: input.name, createdBy: userId }).$returningId();
    await tx.insert(seriesMembers).values(input.trajectoryIds.map((trajectoryId, position) => ({ seriesId, trajectoryId, position, runIds: [] })));
    await recordAudit(tx, { projectId, actorId: userId, action: 'series.created', details: { seriesId, name: input.name, trajectoryIds: input.trajectoryIds } });
    return seriesId;
  });
  await touchProject(ctx, projectId);
  return toSeriesDto(await syncSeries(ctx, id, { requesterId: userId }));
}

/** The project's series, newest first, with the headline numbers last computed (reading this starts nothing). */
export async function listSeries(ctx: AppContext, projectId: number): Promise<SeriesListItem[]> {
  const rows = await ctx.db.select({ s: series, creatorName: users.displayName, members: sql<number>`(SELECT COUNT(*) FROM ${seriesMembers} WHERE ${seriesMembers.seriesId} = ${series.id})` })
    .from(series).innerJoin(users, eq(users.id, series.createdBy)).where(eq(series.projectId, projectId)).orderBy(desc(series.id)).limit(500);
  const out: SeriesListItem[] = [];
  for (const { s, creatorName, members } of rows) {
    const synced = await syncSeries(ctx, s.id, { requesterId: null });
    out.push(headline({ ...s, creatorName }, synced.status, Number(members), synced.results));
  }
  return out;
}

export async function patchSeries(ctx: AppContext, id: number, userId: number, input: PatchSeries): Promise<SeriesDto> {
  const s = await seriesRow(ctx, id);
  const current = await memberRows(ctx, id);
  const currentIds = current.map((m) => m.trajectoryId);
  let order = currentIds;
  if (input.trajectoryIds) order = input.trajectoryIds;
  if (input.removeTrajectoryIds) {
    const strangers = input.removeTrajectoryIds.filter((t) => !currentIds.includes(t));
    if (strangers.length) throw invalidField('removeTrajectoryIds', `trajectory ${strangers.join(', ')} is not a member of this series`);
    order = order.filter((t) => !input.removeTrajectoryIds!.includes(t));
  }
  if (input.addTrajectoryIds) {
    const already = input.addTrajectoryIds.filter((t) => currentIds.includes(t));
    if (already.length) throw invalidField('addTrajectoryIds', `trajectory ${already.join(', ')} is already a member of this series`);
    order = [...order, ...input.addTrajectoryIds];
  }
  const changedMembers = input.trajectoryIds || input.addTrajectoryIds || input.removeTrajectoryIds;
  if (changedMembers && order.length < SERIES_MIN_MEMBERS) {
    throw invalidField(input.trajectoryIds ? 'trajectoryIds' : 'removeTrajectoryIds', `a series keeps at least ${SERIES_MIN_MEMBERS} members`);
  }
  const added = order.filter((t) => !currentIds.includes(t));
  const kept = current.filter((m) => order.includes(m.trajectoryId)).map((m) => m.trajectory);
  await checkedTrajectories(ctx, s.projectId, added, input.trajectoryIds ? 'trajectoryIds' : 'addTrajectoryIds', kept);
  for (const [i, m] of (input.members ?? []).entries()) {
    if (!order.includes(m.trajectoryId)) throw invalidField(`members.${i}.trajectoryId`, `trajectory ${m.trajectoryId} is not a member of this series`);
  }
  const removed = currentIds.filter((t) => !order.includes(t));
  await ctx.db.transaction(async (tx) => {
    if (input.name !== undefined) await tx.update(series).set({ name: input.name }).where(eq(series.id, id));
    if (removed.length) await tx.delete(seriesMembers).where(and(eq(seriesMembers.seriesId, id), inArray(seriesMembers.trajectoryId, removed)));
    if (added.length) await tx.insert(seriesMembers).values(added.map((trajectoryId) => ({ seriesId: id, trajectoryId, position: order.indexOf(trajectoryId), runIds: [] })));
    for (const trajectoryId of order.filter((t) => currentIds.includes(t))) {
      await tx.update(seriesMembers).set({ position: order.indexOf(trajectoryId) }).where(and(eq(seriesMembers.seriesId, id), eq(seriesMembers.trajectoryId, trajectoryId)));
    }
    for (const m of input.members ?? []) {
      const settings: Partial<typeof seriesMembers.$inferInsert> = {};
      if (m.excludedFromFit !== undefined) settings.excludedFromFit = m.excludedFromFit;
      if (m.branch !== undefined) settings.branch = m.branch;
      if (Object.keys(settings).length) await tx.update(seriesMembers).set(settings).where(and(eq(seriesMembers.seriesId, id), eq(seriesMembers.trajectoryId, m.trajectoryId)));
    }
    await tx.update(series).set({ updatedAt: new Date() }).where(eq(series.id, id));
  });
  await touchProject(ctx, s.projectId);
  return toSeriesDto(await syncSeries(ctx, id, { requesterId: userId, retryFailed: input.retryFailed === true }));
}

export async function deleteSeries(ctx: AppContext, id: number, userId: number): Promise<void> {
  const s = await seriesRow(ctx, id);
  await ctx.db.transaction(async (tx) => {
    await tx.delete(series).where(eq(series.id, id));
    await recordAudit(tx, { projectId: s.projectId, actorId: userId, action: 'series.deleted', details: { seriesId: id, name: s.name } });
  });
  await touchProject(ctx, s.projectId);
}
