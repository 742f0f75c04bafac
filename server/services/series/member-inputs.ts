/**
 * A member's inputs to the engine's series results, read from the reports
 * the member's plan points at: one summary merged from them (each analysis
 * from its own report), the g(r) curve, and energies where the run has them.
 */
import { inArray } from 'drizzle-orm';
import type { AnalysisKey } from '../../../shared/analysis-params.ts';
import type { ReportSummary } from '../../../shared/report-summary.ts';
import type { Branch } from '../../../shared/series-results.ts';
import type { SeriesMemberInput } from '../../analysis/series/series-results.ts';
import type { AppContext } from '../../context.ts';
import { reports, type TrajectoryRow } from '../../db/schema/index.ts';
import { decodeCurves, type StoredCurve } from '../report-curves.ts';

export type ReportRow = typeof reports.$inferSelect;

export async function reportRows(ctx: AppContext, ids: readonly number[]): Promise<Map<number, ReportRow>> {
  if (ids.length === 0) return new Map();
  const rows = await ctx.db.select().from(reports).where(inArray(reports.id, [...new Set(ids)]));
  return new Map(rows.map((r) => [r.id, r]));
}

/** Curves of stored reports, each object read once per request. */
export function curveReader(ctx: AppContext) {
  const cache = new Map<string, Promise<Record<string, StoredCurve>>>();
  return (curvesKey: string): Promise<Record<string, StoredCurve>> => {
    let curves = cache.get(curvesKey);
    if (!curves) (curves = ctx.store.getBytes(curvesKey).then(decodeCurves)), cache.set(curvesKey, curves);
    return curves;
  };
}

export interface MemberSource {
  trajectory: TrajectoryRow;
  position: number;
  branch: Branch | null;
  excludedFromFit: boolean;
  reportByAnalysis: Partial<Record<AnalysisKey, number>>;
}

export async function memberInput(
  m: MemberSource, rows: Map<number, ReportRow>, curvesOf: (key: string) => Promise<Record<string, StoredCurve>>,
): Promise<SeriesMemberInput> {
  const summary: Record<string, unknown> = {};
  for (const [key, reportId] of Object.entries(m.reportByAnalysis)) {
    const block = (rows.get(reportId)?.summary as Record<string, unknown> | undefined)?.[key];
    if (block !== undefined) summary[key] = block;
  }
  const merged = Object.keys(summary).length ? (summary as ReportSummary) : null;
  const rdfReport = m.reportByAnalysis.rdf !== undefined ? rows.get(m.reportByAnalysis.rdf) : undefined;
  const rdfCurve = rdfReport ? ((await curvesOf(rdfReport.curvesKey))['rdf'] ?? null) : null;
  const energy = merged?.energy;
  const total = energy?.totalPerAtomEV ?? null;
  const cv = energy?.heatCapacity?.quantity === 'C_V' ? energy.heatCapacity.perAtomKB : null;
  const t = m.trajectory;
  return {
    trajectoryId: t.id, name: t.name, position: m.position, branch: m.branch, excludedFromFits: m.excludedFromFit,
    statedTemperatureK: t.temperatureK, statedPressureBar: null, atoms: t.atoms, speciesCounts: t.speciesCounts ?? null,
    summary: merged, rdfCurve,
    totalEnergy: total ? { eV: total.mean, stdError: total.stdError, kind: 'total' } : null,
    cvFluctuationPerAtomKB: cv ? { value: cv.mean, stdError: cv.stdError } : null,
  };
}
