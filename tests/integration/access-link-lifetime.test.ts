import { and, eq } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { auditLog, projectMembers, projects } from '../../server/db/schema/index.ts';
import { ApiClient } from '../support/api-client.ts';
import { signUp, type TestAccount } from '../support/accounts.ts';
import { insertReportFixture } from '../support/report-fixtures.ts';
import { createTestApp } from '../support/test-app.ts';

const testApp = createTestApp({ PUBLIC_URL: 'http://ergodic.larkspur-lab.example' });
const { app, ctx } = testApp;
afterAll(() => testApp.close());

interface Team { owner: TestAccount; editor: TestAccount; projectId: number; reportId: number }

async function team(label: string): Promise<Team> {
  const owner = await signUp(app, `${label}-owner`);
  const editor = await signUp(app, `${label}-editor`);
  const [{ id: projectId }] = await ctx.db.insert(projects).values({ name: label, createdBy: owner.id, lastActivityAt: new Date() }).$returningId();
  await ctx.db.insert(projectMembers).values([{ projectId, userId: owner.id, role: 'owner' }, { projectId, userId: editor.id, role: 'editor' }]);
  const { reportId } = await insertReportFixture(ctx, projectId, owner.id);
  return { owner, editor, projectId, reportId };
}

async function link(by: TestAccount, reportId: number): Promise<{ id: number; token: string; url: string }> {
  const made = await by.client.send('post', `/api/reports/${reportId}/access-link`, { expiresInDays: 30 }, { Host: 'evil.example' });
  expect(made.status).toBe(201);
  return made.body.link;
}

const anonymous = () => new ApiClient(app);

async function revocationsIn(projectId: number) {
  return ctx.db.select().from(auditLog).where(and(eq(auditLog.projectId, projectId), eq(auditLog.action, 'access_link.revoked')));
}

describe('access links end with their creator\'s right to share', () => {
  it('when a link is made under a forged Host, then its address is the configured one', async () => {
    const { editor, reportId } = await team('link-origin');
    const made = await link(editor, reportId);
    expect(made.url).toBe(`http://ergodic.larkspur-lab.example/links/${made.token}`);
  });

  it('when the editor who made a link is removed, then the link stops working, shows as revoked with the reason, and the audit says so', async () => {
    const { owner, editor, projectId, reportId } = await team('link-removed');
    const theirs = await link(editor, reportId);
    const ownersLink = await link(owner, reportId);
    expect((await anonymous().get(`/api/links/${theirs.token}`)).status).toBe(200);

    expect((await owner.client.delete(`/api/projects/${projectId}/members/${editor.id}`)).status).toBe(204);
    expect((await anonymous().get(`/api/links/${theirs.token}`)).status).toBe(404);
    expect((await anonymous().get(`/api/links/${ownersLink.token}`)).status).toBe(200);
    const listed = (await owner.client.get(`/api/reports/${reportId}/access-links`)).body.links as { id: number; revokedAt: string | null; revokedReason: string | null }[];
    expect(listed.find((l) => l.id === theirs.id)).toMatchObject({ revokedReason: 'creator_left', revokedAt: expect.any(String) });
    expect(listed.find((l) => l.id === ownersLink.id)).toMatchObject({ revokedReason: null, revokedAt: null });
    const audit = await revocationsIn(projectId);
    expect(audit.map((a) => a.details)).toEqual([{ reportId, linkId: theirs.id, reason: 'creator_left', creatorId: editor.id }]);
    expect(audit[0]!.actorId).toBe(owner.id);
  });

  it('when the creator leaves the project themselves, then their links stop working too', async () => {
    const { editor, projectId, reportId } = await team('link-left');
    const theirs = await link(editor, reportId);
    expect((await editor.client.delete(`/api/projects/${projectId}/membership`)).status).toBe(204);
    expect((await anonymous().get(`/api/links/${theirs.token}`)).status).toBe(404);
    expect((await revocationsIn(projectId)).map((a) => a.actorId)).toEqual([editor.id]);
  });

  it('when the creator is made a viewer, who cannot share, then their links stop; when made owner, they keep working', async () => {
    const { owner, editor, projectId, reportId } = await team('link-demoted');
    const theirs = await link(editor, reportId);
    const other = await signUp(app, 'link-promoted');
    await ctx.db.insert(projectMembers).values({ projectId, userId: other.id, role: 'editor' });
    const promotedLink = await link(other, reportId);
    expect((await owner.client.patch(`/api/projects/${projectId}/members/${other.id}`, { role: 'owner' })).status).toBe(200);
    expect((await owner.client.patch(`/api/projects/${projectId}/members/${editor.id}`, { role: 'viewer' })).status).toBe(200);
    expect((await anonymous().get(`/api/links/${theirs.token}`)).status).toBe(404);
    expect((await anonymous().get(`/api/links/${promotedLink.token}`)).status).toBe(200);
    expect((await revocationsIn(projectId)).map((a) => (a.details as { reason: string }).reason)).toEqual(['creator_demoted']);
  });
});
