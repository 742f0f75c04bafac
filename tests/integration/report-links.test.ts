import { eq } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { accessLinks, projectMembers, projects } from '../../server/db/schema/index.ts';
import { ApiClient } from '../support/api-client.ts';
import { signUp, type TestAccount } from '../support/accounts.ts';
import { FIXTURE_MSD_CURVE, FIXTURE_SUMMARY, insertReportFixture } from '../support/report-fixtures.ts';
import { createTestApp } from '../support/test-app.ts';

const testApp = createTestApp();
const { app, ctx } = testApp;
afterAll(() => testApp.close());

async function projectWithReport(owner: TestAccount): Promise<number> {
  const [{ id: projectId }] = await ctx.db.insert(projects).values({ name: 'Links', createdBy: owner.id, lastActivityAt: new Date() }).$returningId();
  await ctx.db.insert(projectMembers).values({ projectId, userId: owner.id, role: 'owner' });
  return (await insertReportFixture(ctx, projectId, owner.id)).reportId;
}

async function linkFor(owner: TestAccount, reportId: number): Promise<{ id: number; token: string }> {
  const made = await owner.client.post(`/api/reports/${reportId}/access-link`, { expiresInDays: 3 });
  expect(made.status).toBe(201);
  return made.body.link;
}

describe('a report read through an access link', () => {
  it('when a link holder reads the report, then it has the same shape and content as a member\'s read, curves included', async () => {
    const owner = await signUp(app, 'link-shape');
    const reportId = await projectWithReport(owner);
    const { token } = await linkFor(owner, reportId);

    const member = await owner.client.get(`/api/reports/${reportId}`);
    const holder = await new ApiClient(app).get(`/api/links/${token}`);

    expect(member.status).toBe(200);
    expect(holder.status).toBe(200);
    expect(holder.body.link.report).toEqual(member.body.report);
    expect(Object.keys(holder.body.link.report).sort()).toEqual(Object.keys(member.body.report).sort());
    expect(holder.body.link.report.summary).toEqual(FIXTURE_SUMMARY);
    expect(holder.body.link.report.curves.msd.data[1]).toEqual(Array.from(FIXTURE_MSD_CURVE.data[1]!));
    expect(new Date(holder.body.link.expiresAt).getTime()).toBeGreaterThan(Date.now() + 2 * 86_400_000);
    const exported = await new ApiClient(app).get(`/api/links/${token}/export.json`);
    expect(exported.headers['content-disposition']).toContain(`ergodic-report-${reportId}.json`);
    expect(exported.body).toEqual(member.body.report);
  });

  it('when a link holder asks for a curve as CSV, then it is the member\'s CSV; an unknown curve is a 404 naming the ones there are', async () => {
    const owner = await signUp(app, 'link-csv');
    const reportId = await projectWithReport(owner);
    const { token } = await linkFor(owner, reportId);
    const holder = new ApiClient(app);

    const csv = await holder.get(`/api/links/${token}/curves/msd.csv`);
    const memberCsv = await owner.client.get(`/api/reports/${reportId}/curves/msd.csv`);

    expect(csv.status).toBe(200);
    expect(csv.headers['content-type']).toMatch(/^text\/csv/);
    expect(csv.headers['content-disposition']).toContain(`ergodic-report-${reportId}-msd.csv`);
    expect(csv.text.split('\n')[0]).toBe('lag (ps),MSD all (Å²)');
    expect(csv.text.split('\n')[2]).toBe('1,0.9');
    expect(csv.text).toBe(memberCsv.text);
    const missing = await holder.get(`/api/links/${token}/curves/vdos.csv`);
    expect(missing.status).toBe(404);
    expect(missing.body.error.message).toMatch(/it has: msd/);
  });

  it('when the link is revoked or expired, then neither the report nor its CSV is served', async () => {
    const owner = await signUp(app, 'link-gone');
    const reportId = await projectWithReport(owner);
    const revoked = await linkFor(owner, reportId);
    const expired = await linkFor(owner, reportId);
    expect((await owner.client.delete(`/api/reports/${reportId}/access-links/${revoked.id}`)).status).toBe(204);
    await ctx.db.update(accessLinks).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(accessLinks.id, expired.id));
    const holder = new ApiClient(app);

    for (const { token } of [revoked, expired]) {
      expect((await holder.get(`/api/links/${token}`)).status).toBe(404);
      expect((await holder.get(`/api/links/${token}/curves/msd.csv`)).status).toBe(404);
      expect((await holder.get(`/api/links/${token}/export.json`)).status).toBe(404);
    }
    expect((await holder.get('/api/links/not-a-token/curves/msd.csv')).status).toBe(404);
  });
});

describe('reports are streamed from the stored curves', () => {
  it('when a browser asks with Accept-Encoding gzip, then the answer is gzip and holds exactly the stored curves, for members and link holders alike', async () => {
    const owner = await signUp(app, 'stream');
    const reportId = await projectWithReport(owner);
    const { token } = await linkFor(owner, reportId);
    const member = await owner.client.raw('get', `/api/reports/${reportId}`).set('Accept-Encoding', 'gzip');
    expect(member.status).toBe(200);
    expect(member.headers['content-encoding']).toBe('gzip');
    expect(member.headers['content-type']).toMatch(/application\/json/);
    expect(member.body.report.curves.msd).toEqual({ columns: FIXTURE_MSD_CURVE.columns, units: FIXTURE_MSD_CURVE.units, data: FIXTURE_MSD_CURVE.data.map((c) => Array.from(c)) });
    const plain = await owner.client.raw('get', `/api/reports/${reportId}`).set('Accept-Encoding', 'identity');
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(plain.body).toEqual(member.body);
    const holder = await new ApiClient(app).send('get', `/api/links/${token}`, undefined, { 'Accept-Encoding': 'gzip' });
    expect(holder.body.link.report).toEqual(member.body.report);
    const exported = await owner.client.raw('get', `/api/reports/${reportId}/export.json`).buffer(true);
    expect(exported.headers['content-disposition']).toMatch(/ergodic-report-\d+\.json/);
    expect(JSON.parse(exported.text)).toEqual(member.body.report);
  });
});
