import { and, eq, inArray } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { analysisRuns, auditLog, projectMembers, trajectories } from '../../server/db/schema/index.ts';
import { startWorker, type RunningWorker } from '../../server/jobs/worker.ts';
import { SERIES_ANALYSES } from '../../server/services/series/member-analyses.ts';
import { seriesCurvesSchema, seriesSchema, type SeriesDto } from '../../shared/series-api.ts';
import { signUp, type TestAccount } from '../support/accounts.ts';
import { ApiClient } from '../support/api-client.ts';
import { pollUntil } from '../support/poll.ts';
import { statePointExtxyz, type StatePointOptions } from '../support/state-point-run.ts';
import { createTestApp } from '../support/test-app.ts';

/**
 * Series through the API with real services: members' analyses run as jobs,
 * finished reports are reused, results follow the members.
 * Known answers: liquids random-walk with D(T) = D0·exp(−E_a/RT) (Arrhenius, SCIENCE item 13),
 * the crystal jitters with a Lindemann ratio of 0.05 (SCIENCE item 23).
 */
const testApp = createTestApp();
const { app, ctx } = testApp;
let worker: RunningWorker;
let owner: TestAccount, editor: TestAccount, viewer: TestAccount, outsider: TestAccount;
let projectId: number;
const R = 8.314462618;
const EA = 6000; // J/mol
const dAt = (t: number) => 0.05 * Math.exp((-EA / R) * (1 / t - 1 / 100)); // Å²/ps, D(100 K) = 0.05
const ids: Record<string, number> = {};

async function upload(client: ApiClient, name: string, o: StatePointOptions): Promise<number> {
  const res = await client.raw('post', `/api/projects/${projectId}/trajectories`)
    .field('temperatureK', String(o.temperatureK)).field('timeUnit', 'ps').field('lengthUnit', 'angstrom').field('velocityUnit', 'angstrom/ps')
    .attach('file', await statePointExtxyz(o), name);
  expect(res.status, res.text).toBe(201);
  const id = res.body.trajectory.id as number;
  const t = await pollUntil(async () => (await client.get(`/api/trajectories/${id}`)).body.trajectory, (t) => t.status !== 'inspecting' && t.status !== 'uploading', 120_000, 200);
  expect([t.status, t.error]).toEqual(['ready', null]);
  return id;
}

const runsOf = (trajectoryId: number) => ctx.db.select().from(analysisRuns).where(eq(analysisRuns.trajectoryId, trajectoryId));

async function settled(client: ApiClient, id: number): Promise<SeriesDto> {
  const dto = await pollUntil(async () => (await client.get(`/api/series/${id}`)).body.series as SeriesDto, (s) => s.status !== 'running', 240_000, 300);
  return seriesSchema.parse(dto);
}

beforeAll(async () => {
  worker = await startWorker(testApp.config, ctx.log);
  [owner, editor, viewer, outsider] = [await signUp(app, 'series-owner'), await signUp(app, 'series-editor'), await signUp(app, 'series-viewer'), await signUp(app, 'series-outsider')];
  projectId = (await owner.client.post('/api/projects', { name: 'Argon state points' })).body.project.id as number;
  await ctx.db.insert(projectMembers).values([{ projectId, userId: editor.id, role: 'editor' }, { projectId, userId: viewer.id, role: 'viewer' }]);
  ids.solid = await upload(owner.client, 'argon-40K.extxyz', { kind: 'crystal', temperatureK: 40, lindemann: 0.05, seed: 1 });
  for (const [i, t] of [100, 125, 160].entries()) ids[`liquid${t}`] = await upload(owner.client, `argon-${t}K.extxyz`, { kind: 'liquid', temperatureK: t, dA2PerPs: dAt(t), seed: 10 + i });
}, 300_000);

afterAll(async () => {
  await worker.close();
  await testApp.close();
});

describe('series of runs through the API', () => {
  let seriesId: number;
  let reusedReportId: number;

  it('when a series names too few, repeated, foreign or other-species trajectories, then a 400 names the field and the trajectory', async () => {
    const post = (body: unknown) => editor.client.post(`/api/projects/${projectId}/series`, body);
    const one = await post({ name: 'Too small', trajectoryIds: [ids.solid] });
    expect(one.status).toBe(400);
    expect(one.body.error.details).toEqual([{ field: 'trajectoryIds', message: 'must list at least 2 trajectories' }]);
    expect((await post({ name: 'Twice', trajectoryIds: [ids.solid, ids.solid] })).body.error.details[0].field).toBe('trajectoryIds');
    expect((await post({ name: '', trajectoryIds: [ids.solid, ids.liquid100] })).body.error.details[0].field).toBe('name');
    const foreign = await post({ name: 'Foreign', trajectoryIds: [ids.solid, 987654321] });
    expect(foreign.status).toBe(400);
    expect(foreign.body.error.message).toBe('trajectoryIds: no trajectory 987654321 in this project');
    const [{ id: neon }] = await ctx.db.insert(trajectories).values({
      projectId, name: 'neon.xyz', objectKey: `test/${projectId}/neon.xyz`, uploadedBy: owner.id, status: 'ready', atoms: 4, frames: 3, speciesCounts: { Ne: 4 }, timeStep: 0.1,
    }).$returningId();
    const mixed = await post({ name: 'Mixed', trajectoryIds: [ids.solid, neon] });
    expect(mixed.status).toBe(400);
    expect(mixed.body.error.details[0].field).toBe('trajectoryIds');
    expect(mixed.body.error.message).toMatch(/one system: neon\.xyz .* has species Ne, argon-40K\.extxyz .* has Ar/);
    expect((await viewer.client.post(`/api/projects/${projectId}/series`, { name: 'Viewer', trajectoryIds: [ids.solid, ids.liquid100] })).status).toBe(403);
  });

  it('when a member already has a finished report with the series\' settings, then the series reuses it and starts no second run', async () => {
    const started = await owner.client.post(`/api/trajectories/${ids.liquid100}/analyses`, { analyses: [...SERIES_ANALYSES] });
    expect(started.status, started.text).toBe(202);
    const job = await pollUntil(async () => (await owner.client.get(`/api/jobs/${started.body.job.id}`)).body.job, (j) => j.status === 'done' || j.status === 'failed', 120_000, 200);
    expect(job.status).toBe('done');
    reusedReportId = job.reportId;

    const created = await editor.client.post(`/api/projects/${projectId}/series`, { name: 'Argon heating', trajectoryIds: [ids.solid, ids.liquid100, ids.liquid125, ids.liquid160] });
    expect(created.status, created.text).toBe(201);
    const dto = seriesSchema.parse(created.body.series);
    seriesId = dto.id;
    expect(dto.members.map((m) => m.trajectoryId)).toEqual([ids.solid, ids.liquid100, ids.liquid125, ids.liquid160]);
    const reused = dto.members[1]!;
    expect(reused.status).toBe('done');
    expect(reused.runs).toEqual([]);
    expect(reused.reportIds).toEqual([reusedReportId]);
    expect((await runsOf(ids.liquid100!)).length).toBe(1);
    for (const m of [dto.members[0]!, dto.members[2]!, dto.members[3]!]) expect(m.runs).toHaveLength(1);
  });

  it('when the members\' runs finish, then the results appear: D(T) with E_a recovered within its error, the crystal solid, melting bracketed', async () => {
    const dto = await settled(viewer.client, seriesId);
    expect(dto.status).toBe('ready');
    expect(dto.members.every((m) => m.status === 'done' && m.progress === 100)).toBe(true);
    const r = dto.results!;
    expect(r.members.map((m) => m.phase.phase)).toEqual(['solid', 'liquid', 'liquid', 'liquid']);
    // Measured kinetic temperature beside the stated one (velocities drawn at the stated T).
    expect(dto.members[2]!.measuredTemperatureK!.mean).toBeCloseTo(125, -1);
    const fit = r.arrhenius;
    expect(fit.status).toBe('fitted');
    expect(fit.leftOut.map((l) => l.trajectoryId)).toEqual([ids.solid]);
    // Known E_a = 6 kJ/mol, within two standard errors (Arrhenius, SCIENCE item 13).
    expect(Math.abs(fit.activationEnergy!.kJPerMol - EA / 1000)).toBeLessThan(2 * fit.activationEnergyStdError!.kJPerMol);
    expect(fit.activationEnergy!.eV).toBeCloseTo(fit.activationEnergy!.kJPerMol / 96.485, 4);
    expect(r.melting.brackets[0]).toMatchObject({ below: { trajectoryId: ids.solid }, above: { trajectoryId: ids.liquid100 }, overlap: false });
    expect(r.melting.caution).toMatch(/superheating/);
    expect(r.caloric.energyKind).toBe('kinetic');
    expect(dto.methods.join(' ')).toMatch(/Arrhenius/);
    // Reading again costs no recomputation: the stored results come back as they were.
    const again = (await viewer.client.get(`/api/series/${seriesId}`)).body.series as SeriesDto;
    expect(again.resultsComputedAt).toBe(dto.resultsComputedAt);

    const curves = await viewer.client.get(`/api/series/${seriesId}/curves`);
    expect(curves.status).toBe(200);
    const overlays = seriesCurvesSchema.parse(curves.body.curves);
    expect(overlays.map((o) => o.kind).sort()).toEqual(['msd', 'rdf', 'sq', 'vacf', 'vdos']);
    for (const o of overlays) expect(o.lines.map((l) => l.trajectoryId)).toEqual([ids.solid, ids.liquid100, ids.liquid125, ids.liquid160]);
    const csv = await viewer.client.get(`/api/series/${seriesId}/members.csv`);
    expect(csv.text.split('\n')[0]).toMatch(/^position,trajectory id,trajectory,/);
    expect(csv.text.trim().split('\n')).toHaveLength(5);
  });

  it('when a member is removed or excluded, then the results are recomputed from the members left, without new runs', async () => {
    const before = (await ctx.db.select().from(analysisRuns).where(inArray(analysisRuns.trajectoryId, Object.values(ids)))).length;
    const removed = await editor.client.patch(`/api/series/${seriesId}`, { removeTrajectoryIds: [ids.liquid160] });
    expect(removed.status, removed.text).toBe(200);
    const dto = seriesSchema.parse(removed.body.series);
    expect(dto.members.map((m) => m.trajectoryId)).toEqual([ids.solid, ids.liquid100, ids.liquid125]);
    expect(dto.results!.members).toHaveLength(3);
    expect(dto.results!.arrhenius.points.map((p) => p.trajectoryId)).toEqual([ids.liquid100, ids.liquid125]);
    const excluded = seriesSchema.parse((await editor.client.patch(`/api/series/${seriesId}`, {
      name: 'Argon heating, two liquids', members: [{ trajectoryId: ids.liquid125, excludedFromFit: true, branch: 'heating' }],
    })).body.series);
    expect(excluded.name).toBe('Argon heating, two liquids');
    expect(excluded.members[2]).toMatchObject({ excludedFromFit: true, branch: 'heating' });
    expect(excluded.results!.arrhenius.status).toBe('not-enough-points');
    expect(excluded.results!.arrhenius.leftOut).toContainEqual({ trajectoryId: ids.liquid125, reason: 'excluded from fits' });
    const after = (await ctx.db.select().from(analysisRuns).where(inArray(analysisRuns.trajectoryId, Object.values(ids)))).length;
    expect(after).toBe(before);

    const bad = await editor.client.patch(`/api/series/${seriesId}`, { removeTrajectoryIds: [ids.liquid100, ids.liquid125] });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details).toEqual([{ field: 'removeTrajectoryIds', message: 'a series keeps at least 2 members' }]);
    expect((await editor.client.patch(`/api/series/${seriesId}`, { members: [{ trajectoryId: ids.liquid160 }] })).body.error.details[0].field).toBe('members.0.trajectoryId');
    expect((await editor.client.patch(`/api/series/${seriesId}`, {})).status).toBe(400);
    // Put back, in a new order: the finished reports are reused.
    const back = seriesSchema.parse((await editor.client.patch(`/api/series/${seriesId}`, { trajectoryIds: [ids.liquid160, ids.solid, ids.liquid100, ids.liquid125] })).body.series);
    expect(back.members.map((m) => [m.trajectoryId, m.position, m.status])).toEqual([[ids.liquid160, 0, 'done'], [ids.solid, 1, 'done'], [ids.liquid100, 2, 'done'], [ids.liquid125, 3, 'done']]);
  });

  it('when people outside the project, viewers, editors and link holders reach the series, then each gets what reports give them', async () => {
    const list = await viewer.client.get(`/api/projects/${projectId}/series`);
    expect(list.body.series).toEqual([expect.objectContaining({ id: seriesId, memberCount: 4, status: 'ready', meltingBracketK: { belowK: expect.any(Number), aboveK: expect.any(Number) } })]);
    expect((await outsider.client.get(`/api/series/${seriesId}`)).status).toBe(404);
    expect((await outsider.client.get(`/api/projects/${projectId}/series`)).status).toBe(404);
    expect((await viewer.client.patch(`/api/series/${seriesId}`, { name: 'Mine' })).status).toBe(403);
    expect((await viewer.client.delete(`/api/series/${seriesId}`)).status).toBe(403);
    const comment = await viewer.client.post(`/api/series/${seriesId}/comments`, { body: 'The 100 K run looks short.' });
    expect(comment.status).toBe(201);
    expect((await editor.client.get(`/api/series/${seriesId}/comments`)).body.comments.map((c: { body: string }) => c.body)).toEqual(['The 100 K run looks short.']);
    expect((await viewer.client.post(`/api/series/${seriesId}/access-link`, { expiresInDays: 7 })).status).toBe(403);

    const made = await editor.client.post(`/api/series/${seriesId}/access-link`, { expiresInDays: 7 });
    expect(made.status, made.text).toBe(201);
    expect(made.body.link.url).toMatch(/\/links\//);
    const stranger = await new ApiClient(app).prime();
    const read = await stranger.get(`/api/links/${made.body.link.token}`);
    expect(read.status).toBe(200);
    expect(read.body.link.series.id).toBe(seriesId);
    expect(read.body.link.series.createdBy).toBeNull();
    expect(read.body.link.report).toBeUndefined();
    expect((await stranger.get(`/api/links/${made.body.link.token}/series-curves`)).body.curves.length).toBe(5);
    expect((await stranger.get(`/api/links/${made.body.link.token}/curves/msd.csv`)).status).toBe(404);
    expect((await stranger.get(`/api/series/${seriesId}`)).status).toBe(401);
    const links = await editor.client.get(`/api/series/${seriesId}/access-links`);
    expect(links.body.links).toHaveLength(1);
    expect((await editor.client.delete(`/api/series/${seriesId}/access-links/${made.body.link.id}`)).status).toBe(204);
    expect((await stranger.get(`/api/links/${made.body.link.token}`)).status).toBe(404);
  });

  it('when a member cannot be analysed, then it is failed with the reason, and the series is incomplete with results from the others', async () => {
    const [{ id: single }] = await ctx.db.insert(trajectories).values({
      projectId, name: 'argon-one-frame.xyz', objectKey: `test/${projectId}/argon-one-frame.xyz`, uploadedBy: owner.id, status: 'ready',
      atoms: 108, frames: 1, speciesCounts: { Ar: 108 }, timeStep: 0.1, timeUnit: 'ps', temperatureK: 150,
    }).$returningId();
    const created = await editor.client.post(`/api/projects/${projectId}/series`, { name: 'With a broken member', trajectoryIds: [ids.liquid100, ids.liquid125, single] });
    expect(created.status, created.text).toBe(201);
    const dto = await settled(owner.client, created.body.series.id);
    expect(dto.status).toBe('incomplete');
    expect(dto.members.map((m) => m.status)).toEqual(['done', 'done', 'failed']);
    expect(dto.members[2]!.message).toMatch(/frame/i);
    expect(dto.members[2]!.runs).toEqual([]);
    expect(dto.results!.arrhenius.points.map((p) => p.trajectoryId)).toEqual([ids.liquid100, ids.liquid125]);
    expect(dto.results!.warnings).toContain('1 of 3 members have no report yet; results use the others.');
    expect((await runsOf(single)).length).toBe(0);
  });

  it('when an editor deletes the series, then it is gone with an audit entry, and its members\' reports stay', async () => {
    expect((await editor.client.delete(`/api/series/${seriesId}`)).status).toBe(204);
    expect((await editor.client.get(`/api/series/${seriesId}`)).status).toBe(404);
    expect((await owner.client.get(`/api/reports/${reusedReportId}`)).status).toBe(200);
    const audit = await ctx.db.select().from(auditLog).where(and(eq(auditLog.projectId, projectId)));
    expect(audit.map((a) => a.action)).toEqual(expect.arrayContaining(['series.created', 'series.deleted', 'access_link.created', 'access_link.revoked']));
  });
});
