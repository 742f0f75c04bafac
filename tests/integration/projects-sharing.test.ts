import { eq } from 'drizzle-orm';
import { afterAll, describe, expect, inject, it } from 'vitest';
import { sha256Hex } from '../../server/auth/secret-token.ts';
import { accessLinks, invitations } from '../../server/db/schema/index.ts';
import { ApiClient } from '../support/api-client.ts';
import { signUp, type TestAccount } from '../support/accounts.ts';
import { tokenFromLink, waitForMail } from '../support/mail-box.ts';
import { FIXTURE_SUMMARY, insertReportFixture } from '../support/report-fixtures.ts';
import { createTestApp } from '../support/test-app.ts';

const testApp = createTestApp();
const { app, ctx } = testApp;
const mailDir = inject('stackEnv')['MAIL_FAKE_DIR']!;
afterAll(() => testApp.close());

async function newProject(owner: TestAccount, name = 'Melting series'): Promise<number> {
  const res = await owner.client.post('/api/projects', { name, description: 'Argon-like runs' });
  expect(res.status).toBe(201);
  return res.body.project.id;
}

/** Invites by e-mail and returns the token from the link in the message. */
async function invite(owner: TestAccount, projectId: number, email: string, role: string, nth = 1): Promise<string> {
  const res = await owner.client.post(`/api/projects/${projectId}/invitations`, { email, role });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return tokenFromLink((await waitForMail(mailDir, email, nth)).text, '/invitations/');
}

async function addMember(owner: TestAccount, projectId: number, role: string, label = role): Promise<TestAccount> {
  const member = await signUp(app, label);
  const token = await invite(owner, projectId, member.email, role);
  expect((await member.client.post(`/api/invitations/${token}/accept`)).status).toBe(200);
  return member;
}

describe('projects', () => {
  it('when a user creates projects, then the list shows name, their role, member count and last activity', async () => {
    const owner = await signUp(app, 'owner');
    const id = await newProject(owner, 'Noble liquids');
    await addMember(owner, id, 'viewer');
    const res = await owner.client.get('/api/projects');
    expect(res.status).toBe(200);
    expect(res.body.projects).toEqual([expect.objectContaining({
      id, name: 'Noble liquids', description: 'Argon-like runs', role: 'owner', memberCount: 2, lastActivityAt: expect.any(String),
    })]);
  });

  it('when an editor renames and describes, then it sticks; when the name is blank, then 400 names the field', async () => {
    const owner = await signUp(app, 'renamer');
    const id = await newProject(owner);
    const editor = await addMember(owner, id, 'editor');
    const res = await editor.client.patch(`/api/projects/${id}`, { name: 'Renamed', description: 'New words' });
    expect(res.status).toBe(200);
    expect(res.body.project).toEqual(expect.objectContaining({ name: 'Renamed', description: 'New words', role: 'editor' }));
    const blank = await editor.client.patch(`/api/projects/${id}`, { name: '  ' });
    expect(blank.status).toBe(400);
    expect(blank.body.error.details).toEqual([{ field: 'name', message: 'must not be empty' }]);
    expect((await owner.client.get(`/api/projects/${id}`)).body.project.name).toBe('Renamed');
  });

  it('when the owner deletes without the exact name, then 400 and the project stays; with it, then it is gone', async () => {
    const owner = await signUp(app, 'deleter');
    const id = await newProject(owner, 'To be deleted');
    const wrong = await owner.client.delete(`/api/projects/${id}`, { confirm: 'to be deleted' });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.message).toMatch(/^confirm: type the project's name exactly/);
    const missing = await owner.client.delete(`/api/projects/${id}`, {});
    expect(missing.status).toBe(400);
    expect(missing.body.error.details[0].field).toBe('confirm');
    expect((await owner.client.get(`/api/projects/${id}`)).status).toBe(200);
    expect((await owner.client.delete(`/api/projects/${id}`, { confirm: 'To be deleted' })).status).toBe(204);
    expect((await owner.client.get(`/api/projects/${id}`)).status).toBe(404);
  });
});

describe('members and the last owner', () => {
  it('when the only owner is demoted or removed, then 409 explains that a project needs an owner', async () => {
    const owner = await signUp(app, 'sole-owner');
    const id = await newProject(owner);
    const demote = await owner.client.patch(`/api/projects/${id}/members/${owner.id}`, { role: 'editor' });
    expect(demote.status).toBe(409);
    expect(demote.body.error.message).toBe('A project needs at least one owner: make another member an owner first.');
    expect((await owner.client.delete(`/api/projects/${id}/members/${owner.id}`)).status).toBe(409);
    expect((await owner.client.delete(`/api/projects/${id}/membership`)).status).toBe(409);
  });

  it('when a second owner exists, then the first may step down and the members list shows the change', async () => {
    const owner = await signUp(app, 'first-owner');
    const id = await newProject(owner);
    const second = await addMember(owner, id, 'editor', 'second');
    expect((await owner.client.patch(`/api/projects/${id}/members/${second.id}`, { role: 'owner' })).status).toBe(200);
    const res = await owner.client.patch(`/api/projects/${id}/members/${owner.id}`, { role: 'viewer' });
    expect(res.status).toBe(200);
    const roles = Object.fromEntries(res.body.members.map((m: { userId: number; role: string }) => [m.userId, m.role]));
    expect(roles).toEqual({ [owner.id]: 'viewer', [second.id]: 'owner' });
    expect((await owner.client.get(`/api/projects/${id}/members`)).status).toBe(200);
    expect((await owner.client.get(`/api/projects/${id}/audit`)).status).toBe(403);
  });

  it('when a role is not one of the three, then 400 lists the allowed roles', async () => {
    const owner = await signUp(app, 'role-typo');
    const id = await newProject(owner);
    const res = await owner.client.patch(`/api/projects/${id}/members/${owner.id}`, { role: 'admin' });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toBe('role: must be one of owner, editor, viewer');
  });
});

describe('invitations', () => {
  it('when a new person follows the mailed link, then they see the project and role, sign up, accept, and read the project', async () => {
    const owner = await signUp(app, 'inviter');
    const id = await newProject(owner, 'Shared benchmark');
    const inviteeEmail = `invitee-${Date.now()}@ergodic-test.example`;
    const token = await invite(owner, id, inviteeEmail, 'viewer');
    const mail = await waitForMail(mailDir, inviteeEmail);
    expect(mail.subject).toContain('"Shared benchmark"');
    expect(mail.text).toMatch(/as a viewer/);

    const visitor = await new ApiClient(app).prime();
    const facts = await visitor.get(`/api/invitations/${token}`);
    expect(facts.status).toBe(200);
    expect(facts.body.invitation).toEqual(expect.objectContaining({ projectName: 'Shared benchmark', email: inviteeEmail, role: 'viewer', invitedBy: owner.displayName }));
    expect((await visitor.post(`/api/invitations/${token}/accept`)).status).toBe(401);

    expect((await visitor.post('/api/auth/register', { email: inviteeEmail, password: 'invitee-password', displayName: 'Invitee' })).status).toBe(201);
    const accepted = await visitor.post(`/api/invitations/${token}/accept`);
    expect(accepted.status).toBe(200);
    expect(accepted.body.project).toEqual(expect.objectContaining({ id, role: 'viewer' }));
    const project = await visitor.get(`/api/projects/${id}`);
    expect(project.body.project.role).toBe('viewer');
    expect((await visitor.patch(`/api/projects/${id}`, { name: 'Mine now' })).status).toBe(403);
  });

  it('when an invitation is used twice, then the second time is 410', async () => {
    const owner = await signUp(app, 'reuse-owner');
    const id = await newProject(owner);
    const member = await signUp(app, 'reuser');
    const token = await invite(owner, id, member.email, 'editor');
    expect((await member.client.post(`/api/invitations/${token}/accept`)).status).toBe(200);
    const again = await member.client.post(`/api/invitations/${token}/accept`);
    expect(again.status).toBe(410);
    expect(again.body.error.message).toMatch(/already accepted/);
  });

  it('when an invitation has expired or was withdrawn, then the link answers 410 and nobody joins', async () => {
    const owner = await signUp(app, 'expiry-owner');
    const id = await newProject(owner);
    const late = await signUp(app, 'late');
    const token = await invite(owner, id, late.email, 'viewer');
    await ctx.db.update(invitations).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(invitations.email, late.email));
    const expired = await late.client.post(`/api/invitations/${token}/accept`);
    expect(expired.status).toBe(410);
    expect(expired.body.error.message).toMatch(/expired/);

    const withdrawn = await signUp(app, 'withdrawn');
    const second = await invite(owner, id, withdrawn.email, 'viewer');
    const pending = await owner.client.get(`/api/projects/${id}/invitations`);
    const entry = pending.body.invitations.find((i: { email: string }) => i.email === withdrawn.email);
    expect((await owner.client.delete(`/api/projects/${id}/invitations/${entry.id}`)).status).toBe(204);
    expect((await withdrawn.client.post(`/api/invitations/${second}/accept`)).status).toBe(410);
    expect((await late.client.get(`/api/projects/${id}`)).status).toBe(404);
    expect((await withdrawn.client.get(`/api/projects/${id}`)).status).toBe(404);
  });

  it('when someone signed in with another e-mail accepts, then 409 names both addresses', async () => {
    const owner = await signUp(app, 'mismatch-owner');
    const id = await newProject(owner);
    const intended = `intended-${Date.now()}@ergodic-test.example`;
    const token = await invite(owner, id, intended, 'viewer');
    const stranger = await signUp(app, 'stranger');
    const res = await stranger.client.post(`/api/invitations/${token}/accept`);
    expect(res.status).toBe(409);
    expect(res.body.error.message).toContain(intended);
    expect(res.body.error.message).toContain(stranger.email);
  });

  it('when the invitee is already a member or the e-mail is malformed, then 409 or 400 says so', async () => {
    const owner = await signUp(app, 'dupe-owner');
    const id = await newProject(owner);
    const dupe = await owner.client.post(`/api/projects/${id}/invitations`, { email: owner.email, role: 'viewer' });
    expect(dupe.status).toBe(409);
    const bad = await owner.client.post(`/api/projects/${id}/invitations`, { email: 'nope', role: 'boss' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.map((d: { field: string }) => d.field).sort()).toEqual(['email', 'role']);
  });
});

describe('access links and comments on a report', () => {
  it('when an editor makes a link, then the token is shown once, the link reads the report, and revoking ends it', async () => {
    const owner = await signUp(app, 'link-owner');
    const id = await newProject(owner);
    const { reportId } = await insertReportFixture(ctx, id, owner.id);
    const editor = await addMember(owner, id, 'editor');

    const made = await editor.client.post(`/api/reports/${reportId}/access-link`, { expiresInDays: 7 });
    expect(made.status).toBe(201);
    const { token, id: linkId, url } = made.body.link;
    expect(url).toMatch(new RegExp(`/links/${token}$`));
    const [stored] = await ctx.db.select().from(accessLinks).where(eq(accessLinks.id, linkId));
    expect(stored!.tokenHash).toBe(sha256Hex(token));

    const listed = await editor.client.get(`/api/reports/${reportId}/access-links`);
    expect(listed.body.links).toHaveLength(1);
    expect(JSON.stringify(listed.body)).not.toContain(token);

    const reader = new ApiClient(app);
    const read = await reader.get(`/api/links/${token}`);
    expect(read.status).toBe(200);
    expect(read.body.link.report).toEqual(expect.objectContaining({
      id: reportId, title: 'MSD of a test run', trajectoryName: 'test-run.xyz', summary: FIXTURE_SUMMARY,
    }));
    expect((await reader.get(`/api/reports/${reportId}/comments`)).status).toBe(401);

    expect((await editor.client.delete(`/api/reports/${reportId}/access-links/${linkId}`)).status).toBe(204);
    expect((await reader.get(`/api/links/${token}`)).status).toBe(404);
    const audit = await owner.client.get(`/api/projects/${id}/audit`);
    const actions = audit.body.entries.map((e: { action: string }) => e.action);
    expect(actions).toEqual(expect.arrayContaining(['access_link.created', 'access_link.revoked', 'invitation.sent', 'member.joined', 'project.created']));
    // Entries about a report carry its title, so the log can name it rather than give its number.
    const linkEntries = audit.body.entries.filter((e: { action: string }) => e.action.startsWith('access_link.'));
    expect(linkEntries.map((e: { names: { report: string | null } }) => e.names.report)).toEqual(['MSD of a test run', 'MSD of a test run']);
  });

  it('when a link has expired, then it reads nothing; when the lifetime is out of range, then 400 names expiresInDays', async () => {
    const owner = await signUp(app, 'link-expiry');
    const id = await newProject(owner);
    const { reportId } = await insertReportFixture(ctx, id, owner.id);
    const made = await owner.client.post(`/api/reports/${reportId}/access-link`, { expiresInDays: 1 });
    await ctx.db.update(accessLinks).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(accessLinks.id, made.body.link.id));
    expect((await new ApiClient(app).get(`/api/links/${made.body.link.token}`)).status).toBe(404);
    const tooLong = await owner.client.post(`/api/reports/${reportId}/access-link`, { expiresInDays: 91 });
    expect(tooLong.status).toBe(400);
    expect(tooLong.body.error.message).toBe('expiresInDays: must be at most 90 days');
  });

  it('when a viewer comments, then everyone in the project reads it in order; an empty comment is refused', async () => {
    const owner = await signUp(app, 'comment-owner');
    const id = await newProject(owner);
    const { reportId } = await insertReportFixture(ctx, id, owner.id);
    const viewer = await addMember(owner, id, 'viewer', 'commenter');
    expect((await viewer.client.post(`/api/reports/${reportId}/comments`, { body: 'The fit window looks early.' })).status).toBe(201);
    expect((await owner.client.post(`/api/reports/${reportId}/comments`, { body: 'Moved it to 5–50 ps.' })).status).toBe(201);
    const res = await owner.client.get(`/api/reports/${reportId}/comments`);
    expect(res.body.comments.map((c: { body: string; author: { displayName: string } }) => [c.author.displayName, c.body])).toEqual([
      [viewer.displayName, 'The fit window looks early.'], [owner.displayName, 'Moved it to 5–50 ps.'],
    ]);
    const empty = await viewer.client.post(`/api/reports/${reportId}/comments`, { body: '   ' });
    expect(empty.status).toBe(400);
    expect(empty.body.error.message).toBe('body: must not be empty');
  });
});
