import { eq } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { analysisRuns, projectMembers, projects, trajectories } from '../../server/db/schema/index.ts';
import { signUp } from '../support/accounts.ts';
import { createTestApp } from '../support/test-app.ts';

const testApp = createTestApp();
const { app, ctx } = testApp;
afterAll(() => testApp.close());

describe('analysis parameters out of bounds', () => {
  it('when an editor asks for 1e-5 Å bins or an absurd lag, then 400 names the field and no run or job is made', async () => {
    const owner = await signUp(app, 'bounds');
    const [{ id: projectId }] = await ctx.db.insert(projects).values({ name: 'Bounds', createdBy: owner.id, lastActivityAt: new Date() }).$returningId();
    await ctx.db.insert(projectMembers).values({ projectId, userId: owner.id, role: 'owner' });
    const [{ id }] = await ctx.db.insert(trajectories).values({
      projectId, name: 'bounded.xyz', objectKey: `projects/${projectId}/trajectories/fixture/bounded.xyz`, uploadedBy: owner.id,
      status: 'ready', atoms: 2, frames: 3, timeStep: 0.01,
    }).$returningId();
    for (const [params, field] of [[{ binWidthA: 1e-5 }, 'binWidthA'], [{ binWidthA: 1e-300 }, 'binWidthA'], [{ maxLagPs: 1e300 }, 'maxLagPs'],
      [{ species: Array.from({ length: 100 }, (_, i) => `X${i}`) }, 'species']] as const) {
      const res = await owner.client.post(`/api/trajectories/${id}/analyses`, { analyses: ['rdf', 'msd'], params });
      expect(res.status, JSON.stringify(res.body)).toBe(400);
      expect(res.body.error.message).toMatch(new RegExp(field));
    }
    expect(await ctx.db.select().from(analysisRuns).where(eq(analysisRuns.trajectoryId, id))).toEqual([]);
  });

  it('when no rMaxA is given and the default range (half the cell) would need more than 20 000 bins, then 400 names binWidthA and no run is made', async () => {
    const owner = await signUp(app, 'default-range');
    const [{ id: projectId }] = await ctx.db.insert(projects).values({ name: 'Wide box', createdBy: owner.id, lastActivityAt: new Date() }).$returningId();
    await ctx.db.insert(projectMembers).values({ projectId, userId: owner.id, role: 'owner' });
    const [{ id }] = await ctx.db.insert(trajectories).values({
      projectId, name: 'wide.xyz', objectKey: `projects/${projectId}/trajectories/fixture/wide.xyz`, uploadedBy: owner.id,
      status: 'ready', atoms: 2, frames: 3, timeStep: 0.01, boundary: 'periodic', cell: [250, 0, 0, 0, 250, 0, 0, 0, 250],
    }).$returningId();
    for (const path of ['analyses', 'analyses/estimate']) {
      const res = await owner.client.post(`/api/trajectories/${id}/${path}`, { analyses: ['rdf'], params: { binWidthA: 0.005 } });
      expect(res.status, JSON.stringify(res.body)).toBe(400);
      expect(res.body.error.message).toMatch(/^binWidthA: the default range \(half the shortest cell width, 125 Å\) in bins of 0\.005 Å makes 25000 bins, more than 20000/);
      expect(res.body.error.details).toEqual([{ field: 'binWidthA', message: expect.stringMatching(/use bins of at least 0\.007 Å or give a shorter rMaxA/) }]);
    }
    const fine = await owner.client.post(`/api/trajectories/${id}/analyses/estimate`, { analyses: ['rdf'], params: { binWidthA: 0.007 } });
    expect(fine.status, JSON.stringify(fine.body)).toBe(200);
    expect(await ctx.db.select().from(analysisRuns).where(eq(analysisRuns.trajectoryId, id))).toEqual([]);
  });
});
