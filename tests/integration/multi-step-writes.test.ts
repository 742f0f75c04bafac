import { eq } from 'drizzle-orm';
import { afterAll, afterEach, describe, expect, inject, it, vi } from 'vitest';
import { apiTokens, invitations, projectMembers, projects, users } from '../../server/db/schema/index.ts';
import type { AuditEntry } from '../../server/services/audit.ts';
import { ApiClient } from '../support/api-client.ts';
import { signIn, signUp, uniqueEmail } from '../support/accounts.ts';
import { tokenFromLink, waitForMail } from '../support/mail-box.ts';
import { createTestApp } from '../support/test-app.ts';

/** The last step of each multi-step write is its audit entry; making that step fail shows whether the earlier ones roll back. */
const failing = vi.hoisted(() => ({ action: null as string | null }));
vi.mock('../../server/services/audit.ts', async (importOriginal) => {
  const original = await importOriginal<typeof import('../../server/services/audit.ts')>();
  return {
    ...original,
    recordAudit: async (db: Parameters<typeof original.recordAudit>[0], entry: AuditEntry) => {
      await original.recordAudit(db, entry);
      if (entry.action === failing.action) throw new Error(`simulated failure after writing ${entry.action}`);
    },
  };
});

const testApp = createTestApp({ LOG_LEVEL: 'silent' });
const { app, ctx } = testApp;
const mailDir = inject('stackEnv')['MAIL_FAKE_DIR']!;
afterEach(() => { failing.action = null; });
afterAll(() => testApp.close());

describe('multi-step writes are all or nothing', () => {
  it('when a password reset fails at its last step, then the password, the link, the sessions and the tokens are as before', async () => {
    const account = await signUp(app, 'tx-reset');
    const token = (await account.client.post('/api/tokens', { name: 'kept' })).body.token.token as string;
    const [before] = await ctx.db.select().from(users).where(eq(users.id, account.id));
    await (await new ApiClient(app).prime()).post('/api/auth/password-reset', { email: account.email });
    const resetToken = tokenFromLink((await waitForMail(mailDir, account.email)).text, '/reset-password?token=');

    failing.action = 'user.password_reset';
    const failed = await (await new ApiClient(app).prime()).post('/api/auth/password-reset/confirm', { token: resetToken, password: 'never-stored-password' });
    expect(failed.status).toBe(500);
    const [after] = await ctx.db.select().from(users).where(eq(users.id, account.id));
    expect(after!.passwordHash).toBe(before!.passwordHash);
    expect((await account.client.get('/api/auth/me')).status).toBe(200);
    expect((await ApiClient.withToken(app, token).get('/api/auth/me')).status).toBe(200);
    const [tokenRow] = await ctx.db.select().from(apiTokens).where(eq(apiTokens.userId, account.id));
    expect(tokenRow!.revokedAt).toBeNull();

    failing.action = null;
    const retried = await (await new ApiClient(app).prime()).post('/api/auth/password-reset/confirm', { token: resetToken, password: 'the-stored-password' });
    expect(retried.status).toBe(200);
    await signIn(app, account.email, 'the-stored-password');
  });

  it('when accepting an invitation fails at its last step, then there is no membership and the invitation can still be accepted', async () => {
    const owner = await signUp(app, 'tx-owner');
    const projectId = (await owner.client.post('/api/projects', { name: 'Transactions' })).body.project.id as number;
    const invitee = await signUp(app, 'tx-invitee');
    expect((await owner.client.post(`/api/projects/${projectId}/invitations`, { email: invitee.email, role: 'editor' })).status).toBe(201);
    const token = tokenFromLink((await waitForMail(mailDir, invitee.email)).text, '/invitations/');

    failing.action = 'member.joined';
    expect((await invitee.client.post(`/api/invitations/${token}/accept`)).status).toBe(500);
    expect(await ctx.db.select().from(projectMembers).where(eq(projectMembers.userId, invitee.id))).toEqual([]);
    const [invitation] = await ctx.db.select().from(invitations).where(eq(invitations.email, invitee.email));
    expect(invitation!.acceptedAt).toBeNull();

    failing.action = null;
    expect((await invitee.client.post(`/api/invitations/${token}/accept`)).status).toBe(200);
    expect(await ctx.db.select().from(projectMembers).where(eq(projectMembers.userId, invitee.id))).toHaveLength(1);
  });

  it('when deleting a project fails at its last step, then the project and its members are still there', async () => {
    const owner = await signUp(app, 'tx-delete');
    const projectId = (await owner.client.post('/api/projects', { name: 'Still here' })).body.project.id as number;
    failing.action = 'project.deleted';
    expect((await owner.client.delete(`/api/projects/${projectId}`, { confirm: 'Still here' })).status).toBe(500);
    expect(await ctx.db.select().from(projects).where(eq(projects.id, projectId))).toHaveLength(1);
    expect(await ctx.db.select().from(projectMembers).where(eq(projectMembers.projectId, projectId))).toHaveLength(1);
    failing.action = null;
    expect((await owner.client.delete(`/api/projects/${projectId}`, { confirm: 'Still here' })).status).toBe(204);
    expect(await ctx.db.select().from(projects).where(eq(projects.id, projectId))).toEqual([]);
  });

  it('when an invitation is made for an address, then an earlier pending one is withdrawn in the same step', async () => {
    const owner = await signUp(app, 'tx-reinvite');
    const projectId = (await owner.client.post('/api/projects', { name: 'Reinvite' })).body.project.id as number;
    const email = uniqueEmail('twice');
    await owner.client.post(`/api/projects/${projectId}/invitations`, { email, role: 'viewer' });
    await owner.client.post(`/api/projects/${projectId}/invitations`, { email, role: 'editor' });
    const pending = (await owner.client.get(`/api/projects/${projectId}/invitations`)).body.invitations as { role: string }[];
    expect(pending.map((p) => p.role)).toEqual(['editor']);
  });
});
