import type { ReportSummary } from '../../shared/report-summary.ts';
import type { AppContext } from '../../server/context.ts';
import { analysisRuns, reports, series, seriesMembers, trajectories } from '../../server/db/schema/index.ts';
import { encodeCurves } from '../../server/services/report-curves.ts';

export interface ReportFixture {
  trajectoryId: number;
  runId: number;
  reportId: number;
  seriesId: number;
}

/** A hand-written MSD headline in the engine's shape: D = 0.15 Å²/ps. */
export const FIXTURE_SUMMARY: ReportSummary = {
  msd: {
    dimensions: 3,
    groups: [{
      label: 'all', atoms: 2, regime: 'diffusive', d: { a2PerPs: 0.15, e9M2PerS: 1.5, cm2PerS: 1.5e-5 },
      dStdError: { a2PerPs: 0.01, e9M2PerS: 0.1, cm2PerS: 1e-6 }, uncertaintyMethod: 'fit-residuals', slopeExponent: 1,
      fitWindowPs: { start: 1, end: 2, source: 'manual' }, plateauA2: null,
    }],
  },
};

/** MSD = 6·D·t at three lags, the curve the summary above was fitted to. */
export const FIXTURE_MSD_CURVE = {
  columns: ['lag', 'MSD all'], units: ['ps', 'Å²'], data: [Float64Array.of(0, 1, 2), Float64Array.of(0, 0.9, 1.8)],
};

/** Minimal rows and stored curves for one finished analysis of one trajectory, as the jobs would leave them. */
export async function insertReportFixture(ctx: Pick<AppContext, 'db' | 'store'>, projectId: number, userId: number, title = 'MSD of a test run'): Promise<ReportFixture> {
  const { db } = ctx;
  const [{ id: trajectoryId }] = await db.insert(trajectories).values({
    projectId, name: 'test-run.xyz', objectKey: `test/${projectId}/test-run.xyz`, uploadedBy: userId, status: 'ready', atoms: 2, frames: 3,
  }).$returningId();
  const [{ id: runId }] = await db.insert(analysisRuns).values({
    projectId, trajectoryId, requestedBy: userId, analyses: ['msd'], params: {}, status: 'done', progress: 100,
  }).$returningId();
  const curvesKey = `test/${projectId}/run-${runId}/curves.json.gz`;
  await ctx.store.putBytes(curvesKey, encodeCurves({ msd: FIXTURE_MSD_CURVE }), 'application/gzip');
  const [{ id: reportId }] = await db.insert(reports).values({
    runId, projectId, trajectoryId, title, analyses: ['msd'], params: { fitWindow: { mode: 'manual', startPs: 1, endPs: 2 } },
    summary: FIXTURE_SUMMARY as Record<string, unknown>, methods: { msd: { unwrapped: true } },
    curvesKey, engineVersion: '0.1.0',
  }).$returningId();
  const [{ id: seriesId }] = await db.insert(series).values({ projectId, name: 'test series', createdBy: userId }).$returningId();
  await db.insert(seriesMembers).values({ seriesId, trajectoryId });
  return { trajectoryId, runId, reportId, seriesId };
}
