import { eq, inArray } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { trajectories } from '../../server/db/schema/index.ts';
import { signUp, type TestAccount } from '../support/accounts.ts';
import { createTestApp } from '../support/test-app.ts';

const testApp = createTestApp();
const { app, ctx } = testApp;
afterAll(() => testApp.close());

async function projectWithTrajectories(owner: TestAccount, names: string[]): Promise<{ projectId: number; ids: number[] }> {
  const projectId = (await owner.client.post('/api/projects', { name: `Bulk ${names.join(' ')}` })).body.project.id as number;
  const ids: number[] = [];
  for (const name of names) {
    const [{ id }] = await ctx.db.insert(trajectories).values({
      projectId, name, objectKey: `test/${projectId}/${name}`, uploadedBy: owner.id, status: 'ready', timeStep: 1, timeUnit: 'fs', fromFile: ['timeStep'],
    }).$returningId();
    ids.push(id);
  }
  return { projectId, ids };
}

describe('PATCH /api/projects/:id/trajectories', () => {
  it('when several trajectories get one change, then each has it, no longer marked as from the file, and their names stay', async () => {
    const owner = await signUp(app, 'bulk-owner');
    const { projectId, ids } = await projectWithTrajectories(owner, ['run-300K.xyz', 'run-400K.xyz', 'untouched.xyz']);

    const res = await owner.client.patch(`/api/projects/${projectId}/trajectories`, { ids: ids.slice(0, 2), changes: { timeStep: 2, potential: 'LJ 12-6, ε/k = 120 K' } });

    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.trajectories.map((t: { name: string; timeStep: number; potential: string; fromFile: string[] }) => [t.name, t.timeStep, t.potential, t.fromFile]))
      .toEqual([['run-300K.xyz', 2, 'LJ 12-6, ε/k = 120 K', []], ['run-400K.xyz', 2, 'LJ 12-6, ε/k = 120 K', []]]);
    const [untouched] = await ctx.db.select().from(trajectories).where(eq(trajectories.id, ids[2]!));
    expect(untouched!.timeStep).toBe(1);
    expect(untouched!.fromFile).toEqual(['timeStep']);
  });

  it('when one id belongs to another project, then nothing changes and the answer names it', async () => {
    const owner = await signUp(app, 'bulk-owner2');
    const mine = await projectWithTrajectories(owner, ['a.xyz']);
    const theirs = await projectWithTrajectories(await signUp(app, 'bulk-other'), ['b.xyz']);

    const res = await owner.client.patch(`/api/projects/${mine.projectId}/trajectories`, { ids: [mine.ids[0], theirs.ids[0]], changes: { temperatureK: 300 } });

    expect(res.status).toBe(404);
    expect(res.body.error.message).toContain(String(theirs.ids[0]));
    const rows = await ctx.db.select().from(trajectories).where(inArray(trajectories.id, [mine.ids[0]!, theirs.ids[0]!]));
    expect(rows.map((r) => r.temperatureK)).toEqual([null, null]);
  });

  it('when the body names no change, a bad value or a name, then 400 says which field', async () => {
    const owner = await signUp(app, 'bulk-owner3');
    const { projectId, ids } = await projectWithTrajectories(owner, ['c.xyz']);
    const none = await owner.client.patch(`/api/projects/${projectId}/trajectories`, { ids, changes: {} });
    expect(none.status).toBe(400);
    expect(none.body.error.message).toMatch(/at least one field/);
    const bad = await owner.client.patch(`/api/projects/${projectId}/trajectories`, { ids, changes: { temperatureK: -3 } });
    expect(bad.body.error.details).toEqual([{ field: 'changes.temperatureK', message: 'must be above 0 K' }]);
    const renamed = await owner.client.patch(`/api/projects/${projectId}/trajectories`, { ids, changes: { name: 'same.xyz' } });
    expect(renamed.status).toBe(400);
  });
});
