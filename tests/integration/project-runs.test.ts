import { afterAll, describe, expect, it } from 'vitest';
import { analysisRuns } from '../../server/db/schema/index.ts';
import { signUp } from '../support/accounts.ts';
import { insertReportFixture } from '../support/report-fixtures.ts';
import { createTestApp } from '../support/test-app.ts';

const testApp = createTestApp();
const { app, ctx } = testApp;
afterAll(() => testApp.close());

async function newProject(owner: Awaited<ReturnType<typeof signUp>>, name: string): Promise<number> {
  return (await owner.client.post('/api/projects', { name })).body.project.id as number;
}

describe('GET /api/projects/:id/analyses', () => {
  it('when runs of several trajectories exist, then the project lists all of them newest first, with failure reasons, and none of another project', async () => {
    const owner = await signUp(app, 'runs-owner');
    const projectId = await newProject(owner, 'Runs of a project');
    const otherId = await newProject(owner, 'Another project');
    const first = await insertReportFixture(ctx, projectId, owner.id);
    const second = await insertReportFixture(ctx, projectId, owner.id);
    const elsewhere = await insertReportFixture(ctx, otherId, owner.id);
    const [{ id: failedId }] = await ctx.db.insert(analysisRuns).values({
      projectId, trajectoryId: second.trajectoryId, requestedBy: owner.id, analyses: ['vdos'], params: {},
      status: 'failed', error: 'The VDOS needs velocities or at least 4 frames.',
    }).$returningId();

    const res = await owner.client.get(`/api/projects/${projectId}/analyses`);

    expect(res.status).toBe(200);
    const ids = (res.body.jobs as { id: number }[]).map((j) => j.id);
    expect(ids).toEqual([failedId, second.runId, first.runId]);
    expect(ids).not.toContain(elsewhere.runId);
    expect(res.body.jobs[0]).toEqual(expect.objectContaining({ status: 'failed', error: 'The VDOS needs velocities or at least 4 frames.', trajectoryId: second.trajectoryId }));
    expect(res.body.jobs[1]).toEqual(expect.objectContaining({ status: 'done', trajectoryId: second.trajectoryId, requestedBy: { id: owner.id, displayName: owner.displayName } }));
  });

  it('when someone outside the project asks, then it is 404 as for every project resource', async () => {
    const owner = await signUp(app, 'runs-owner2');
    const stranger = await signUp(app, 'runs-stranger');
    const projectId = await newProject(owner, 'Private runs');
    expect((await stranger.client.get(`/api/projects/${projectId}/analyses`)).status).toBe(404);
  });
});
