import { eq } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { analysisRuns, trajectories } from '../../server/db/schema/index.ts';
import { signUp } from '../support/accounts.ts';
import { insertReportFixture } from '../support/report-fixtures.ts';
import { createTestApp } from '../support/test-app.ts';

const testApp = createTestApp();
const { app, ctx } = testApp;
afterAll(() => testApp.close());

describe('telling reports apart', () => {
  it('when a run is started with notes, then the job keeps them, and blank or over-long notes are handled', async () => {
    const owner = await signUp(app, 'notes-owner');
    const projectId = (await owner.client.post('/api/projects', { name: 'Notes' })).body.project.id as number;
    const { trajectoryId } = await insertReportFixture(ctx, projectId, owner.id);
    await ctx.db.update(trajectories).set({ timeStep: 0.01, timeUnit: 'ps' }).where(eq(trajectories.id, trajectoryId));

    const started = await owner.client.post(`/api/trajectories/${trajectoryId}/analyses`, { analyses: ['msd'], notes: '  fit window moved later  ' });
    expect(started.status, JSON.stringify(started.body)).toBe(202);
    expect(started.body.job.notes).toBe('fit window moved later');
    const plain = await owner.client.post(`/api/trajectories/${trajectoryId}/analyses`, { analyses: ['msd'] });
    expect(plain.body.job.notes).toBe('');
    const long = await owner.client.post(`/api/trajectories/${trajectoryId}/analyses`, { analyses: ['msd'], notes: 'x'.repeat(2001) });
    expect(long.status).toBe(400);
    expect(long.body.error.details).toEqual([{ field: 'notes', message: 'must be at most 2000 characters' }]);
  });

  it('when reports are listed, then each carries its run\'s notes and its key numbers: D with its error, T, peaks', async () => {
    const owner = await signUp(app, 'list-owner');
    const projectId = (await owner.client.post('/api/projects', { name: 'Report list' })).body.project.id as number;
    const fixture = await insertReportFixture(ctx, projectId, owner.id, 'test-run.xyz: MSD — fit 1–2 ps');
    await ctx.db.update(analysisRuns).set({ notes: 'manual window, as in the draft' }).where(eq(analysisRuns.id, fixture.runId));

    const list = await owner.client.get(`/api/projects/${projectId}/reports`);
    const report = await owner.client.get(`/api/reports/${fixture.reportId}`);

    expect(list.body.reports).toEqual([expect.objectContaining({
      id: fixture.reportId, title: 'test-run.xyz: MSD — fit 1–2 ps', notes: 'manual window, as in the draft',
      // FIXTURE_SUMMARY: D = 0.15 Å²/ps = 1.5 × 10⁻⁹ m²/s ± 0.1, from the MSD; no thermo, VDOS or g(r) in it.
      keyNumbers: { diffusion: { e9M2PerS: 1.5, stdError: 0.1, method: 'Einstein' }, temperatureK: null, vdosPeaksCm1: [], rdfFirstPeakA: null },
    })]);
    expect(report.body.report.notes).toBe('manual window, as in the draft');
  });
});
