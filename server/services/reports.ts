import { desc, eq } from 'drizzle-orm';
import type { ReportDto, ReportListItem } from '../../shared/report.ts';
import type { AppContext } from '../context.ts';
import { analysisRuns, reports, trajectories } from '../db/schema/index.ts';
import { keyNumbersOf } from '../../shared/report-key-numbers.ts';
import type { ReportSummary } from '../../shared/report-summary.ts';
import { notFound } from '../errors.ts';
import { curveToCsv, decodeCurves } from './report-curves.ts';

/** A report with its file's name and its run's notes. */
function reportQuery(ctx: AppContext) {
  return ctx.db.select({ r: reports, trajectoryName: trajectories.name, notes: analysisRuns.notes }).from(reports)
    .innerJoin(trajectories, eq(trajectories.id, reports.trajectoryId))
    .leftJoin(analysisRuns, eq(analysisRuns.id, reports.runId));
}

async function reportRow(ctx: AppContext, id: number) {
  const [row] = await reportQuery(ctx).where(eq(reports.id, id));
  if (!row) throw notFound('Report');
  return row;
}

/**
 * A report without its curves, and where they are stored: routes stream the
 * curves from the store into the answer (see `sendWithStoredCurves`).
 */
export async function getReportHead(ctx: AppContext, id: number): Promise<{ report: Omit<ReportDto, 'curves'>; curvesKey: string }> {
  const { r, trajectoryName, notes } = await reportRow(ctx, id);
  return {
    curvesKey: r.curvesKey,
    report: {
      id: r.id, projectId: r.projectId, trajectoryId: r.trajectoryId, trajectoryName, runId: r.runId, title: r.title, notes: notes ?? '',
      analyses: r.analyses, params: r.params, summary: r.summary as ReportDto['summary'], methods: r.methods,
      engineVersion: r.engineVersion, inputSha256: r.inputSha256, createdAt: r.createdAt.toISOString(),
    },
  };
}

/** The whole report with its curves, parsed: for code that needs the numbers, not for answering requests. */
export async function getReport(ctx: AppContext, id: number): Promise<ReportDto> {
  const { r, trajectoryName, notes } = await reportRow(ctx, id);
  const curves = decodeCurves(await ctx.store.getBytes(r.curvesKey));
  return {
    id: r.id, projectId: r.projectId, trajectoryId: r.trajectoryId, trajectoryName, runId: r.runId, title: r.title, notes: notes ?? '',
    analyses: r.analyses, params: r.params, summary: r.summary as ReportDto['summary'], methods: r.methods,
    engineVersion: r.engineVersion, inputSha256: r.inputSha256, createdAt: r.createdAt.toISOString(), curves,
  };
}

export async function getCurveCsv(ctx: AppContext, id: number, name: string): Promise<string> {
  const { r } = await reportRow(ctx, id);
  const curves = decodeCurves(await ctx.store.getBytes(r.curvesKey));
  const curve = Object.hasOwn(curves, name) ? curves[name] : undefined;
  if (!curve) throw notFound(`Curve "${name}" in report ${id} (it has: ${Object.keys(curves).join(', ') || 'none'})`);
  return curveToCsv(curve);
}

export async function listReports(ctx: AppContext, projectId: number): Promise<ReportListItem[]> {
  const rows = await reportQuery(ctx).where(eq(reports.projectId, projectId)).orderBy(desc(reports.id)).limit(500);
  return rows.map(({ r, trajectoryName, notes }) => ({
    id: r.id, trajectoryId: r.trajectoryId, trajectoryName, title: r.title, notes: notes ?? '', analyses: r.analyses,
    keyNumbers: keyNumbersOf(r.summary as ReportSummary), createdAt: r.createdAt.toISOString(),
  }));
}
