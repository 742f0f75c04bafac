import { eq } from 'drizzle-orm';
import { afterAll, describe, expect, inject, it } from 'vitest';
import { auditLog, users } from '../../server/db/schema/index.ts';
import { ApiClient } from '../support/api-client.ts';
import { signIn, signUp } from '../support/accounts.ts';
import { tokenFromLink, waitForMail } from '../support/mail-box.ts';
import { createTestApp } from '../support/test-app.ts';

const testApp = createTestApp({ PUBLIC_URL: 'http://ergodic.larkspur-lab.example' });
const { app, ctx } = testApp;
const mailDir = inject('stackEnv')['MAIL_FAKE_DIR']!;
afterAll(() => testApp.close());

async function resetPassword(email: string, password: string): Promise<ApiClient> {
  const anonymous = await new ApiClient(app).prime();
  expect((await anonymous.post('/api/auth/password-reset', { email })).status).toBe(202);
  const token = tokenFromLink((await waitForMail(mailDir, email)).text, '/reset-password?token=');
  const client = await new ApiClient(app).prime();
  const done = await client.post('/api/auth/password-reset/confirm', { token, password });
  expect(done.status, JSON.stringify(done.body)).toBe(200);
  return client;
}

describe('API tokens and account recovery', () => {
  it('when the password is reset, then every API token stops working and the tokens page says the reset revoked it', async () => {
    const account = await signUp(app, 'reset-tokens');
    const first = (await account.client.post('/api/tokens', { name: 'cluster' })).body.token.token as string;
    const second = (await account.client.post('/api/tokens', { name: 'laptop' })).body.token.token as string;
    expect((await ApiClient.withToken(app, first).get('/api/auth/me')).status).toBe(200);

    const client = await resetPassword(account.email, 'a-fresh-password-after-reset');
    for (const token of [first, second]) expect((await ApiClient.withToken(app, token).get('/api/auth/me')).status).toBe(401);
    const listed = (await client.get('/api/tokens')).body.tokens as { name: string; revokedReason: string | null }[];
    expect(listed.map((t) => [t.name, t.revokedReason]).sort()).toEqual([['cluster', 'password_reset'], ['laptop', 'password_reset']]);
    const [entry] = await ctx.db.select().from(auditLog).where(eq(auditLog.action, 'user.password_reset'))
      .then((rows) => rows.filter((r) => r.actorId === account.id));
    expect(entry?.details).toEqual({ revokedTokens: 2 });
    // A token made after the reset works.
    const fresh = (await client.post('/api/tokens', { name: 'new' })).body.token.token as string;
    expect((await ApiClient.withToken(app, fresh).get('/api/auth/me')).status).toBe(200);
  });

  it('when a script with a token tries to create or revoke tokens, then it is refused with 403 and nothing changes', async () => {
    const account = await signUp(app, 'token-minting');
    const made = (await account.client.post('/api/tokens', { name: 'script' })).body.token;
    const sibling = (await account.client.post('/api/tokens', { name: 'sibling' })).body.token;
    const script = ApiClient.withToken(app, made.token);
    const mint = await script.post('/api/tokens', { name: 'offspring' });
    expect(mint.status).toBe(403);
    expect(mint.body.error.message).toMatch(/only from a signed-in browser session, not with an API token/);
    expect((await script.delete(`/api/tokens/${sibling.id}`)).status).toBe(403);
    expect((await ApiClient.withToken(app, sibling.token).get('/api/auth/me')).status).toBe(200);
    expect((await account.client.get('/api/tokens')).body.tokens).toHaveLength(2);
  });

  it('when a token is made with an expiry, then it works until then and not after', async () => {
    const account = await signUp(app, 'token-expiry');
    const made = await account.client.post('/api/tokens', { name: 'a week', expiresInDays: 7 });
    expect(made.status).toBe(201);
    const expiresAt = new Date(made.body.token.expiresAt).getTime();
    expect(Math.abs(expiresAt - (Date.now() + 7 * 86_400_000))).toBeLessThan(60_000);
    const script = ApiClient.withToken(app, made.body.token.token);
    expect((await script.get('/api/auth/me')).status).toBe(200);
    await ctx.db.execute(`UPDATE api_tokens SET expires_at = NOW(3) - INTERVAL 1 SECOND WHERE id = ${Number(made.body.token.id)}`);
    expect((await script.get('/api/auth/me')).status).toBe(401);
    const bad = await account.client.post('/api/tokens', { name: 'forever', expiresInDays: 5000 });
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toMatch(/expiresInDays: must be at most 366 days/);
  });
});

describe('links in e-mails', () => {
  it('when a reset is asked for with a forged Host header, then the e-mailed link points at the configured address only', async () => {
    const account = await signUp(app, 'host-forgery');
    const anonymous = await new ApiClient(app).prime();
    const res = await anonymous.send('post', '/api/auth/password-reset', { email: account.email },
      { Host: 'evil.example', 'X-Forwarded-Host': 'evil.example', 'X-Forwarded-Proto': 'http' });
    expect(res.status).toBe(202);
    const mail = await waitForMail(mailDir, account.email);
    expect(mail.text).not.toMatch(/evil\.example/);
    expect(mail.text).toMatch(/http:\/\/ergodic\.larkspur-lab\.example\/reset-password\?token=/);
  });

  it('when an invitation is made under a forged Host, then its link uses the configured address too', async () => {
    const owner = await signUp(app, 'host-invite');
    const projectId = (await owner.client.post('/api/projects', { name: 'Forged host' })).body.project.id;
    const invitee = `invitee-${Date.now()}@ergodic-test.example`;
    const invited = await owner.client.send('post', `/api/projects/${projectId}/invitations`, { email: invitee, role: 'viewer' }, { Host: 'evil.example' });
    expect(invited.status).toBe(201);
    const mail = await waitForMail(mailDir, invitee);
    expect(mail.text).not.toMatch(/evil\.example/);
    expect(mail.text).toMatch(/http:\/\/ergodic\.larkspur-lab\.example\/invitations\//);
  });

  it('when no PUBLIC_URL is set, then links use the address the server listens on, never the Host header', async () => {
    const local = createTestApp({ PUBLIC_URL: '', HOST: '127.0.0.1', PORT: '4391' });
    try {
      const account = await signUp(local.app, 'host-local');
      const anonymous = await new ApiClient(local.app).prime();
      await anonymous.send('post', '/api/auth/password-reset', { email: account.email }, { Host: 'evil.example' });
      const mail = await waitForMail(mailDir, account.email);
      expect(mail.text).toMatch(/http:\/\/127\.0\.0\.1:4391\/reset-password\?token=/);
      expect(mail.text).not.toMatch(/evil\.example/);
    } finally {
      await local.close();
    }
  });
});

describe('disabled and enabled again', () => {
  it('when an account is disabled, then its tokens are revoked with that reason, in the same step as the disable', async () => {
    const admin = await signUp(app, 'recovery-admin');
    await ctx.db.update(users).set({ role: 'admin' }).where(eq(users.id, admin.id));
    const user = await signUp(app, 'recovery-user');
    await user.client.post('/api/tokens', { name: 'one' });
    await user.client.post('/api/tokens', { name: 'two' });
    expect((await admin.client.patch(`/api/admin/users/${user.id}`, { disabled: true })).status).toBe(200);
    const rows = await ctx.db.select().from(auditLog).where(eq(auditLog.action, 'user.disabled'));
    expect(rows.find((r) => (r.details as { userId?: number }).userId === user.id)?.details).toEqual({ userId: user.id, revokedTokens: 2 });
    await admin.client.patch(`/api/admin/users/${user.id}`, { disabled: false });
    const back = await signIn(app, user.email, user.password);
    const tokens = (await back.get('/api/tokens')).body.tokens as { revokedReason: string }[];
    expect(tokens.map((t) => t.revokedReason)).toEqual(['account_disabled', 'account_disabled']);
  });
});
