import type { Database } from '../../server/db/client.ts';
import { analysisRuns, reports, series, seriesMembers, trajectories } from '../../server/db/schema/index.ts';

export interface ReportFixture {
  trajectoryId: number;
  runId: number;
  reportId: number;
  seriesId: number;
}

/** Minimal rows for one finished analysis of one trajectory, as the jobs would leave them. */
export async function insertReportFixture(db: Database, projectId: number, userId: number, title = 'MSD of a test run'): Promise<ReportFixture> {
  const [{ id: trajectoryId }] = await db.insert(trajectories).values({
    projectId, name: 'test-run.xyz', objectKey: `test/${projectId}/test-run.xyz`, uploadedBy: userId, status: 'ready', atoms: 2, frames: 3,
  }).$returningId();
  const [{ id: runId }] = await db.insert(analysisRuns).values({
    projectId, trajectoryId, requestedBy: userId, analyses: ['msd'], params: {}, status: 'done', progress: 100,
  }).$returningId();
  const [{ id: reportId }] = await db.insert(reports).values({
    runId, projectId, trajectoryId, title, analyses: ['msd'], params: { fitWindow: [1, 2] },
    summary: { diffusion: { value: 1.5, uncertainty: 0.1, unit: 'Å²/ps' } }, methods: { msd: 'FFT over all origins' },
    curvesKey: `test/${projectId}/curves.json.gz`, engineVersion: '0.1.0',
  }).$returningId();
  const [{ id: seriesId }] = await db.insert(series).values({ projectId, name: 'test series', createdBy: userId }).$returningId();
  await db.insert(seriesMembers).values({ seriesId, trajectoryId });
  return { trajectoryId, runId, reportId, seriesId };
}
