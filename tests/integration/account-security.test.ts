import { eq, inArray } from 'drizzle-orm';
import request from 'supertest';
import { inject } from 'vitest';
import { afterAll, describe, expect, it } from 'vitest';
import { passwordResets, users } from '../../server/db/schema/index.ts';
import { ApiClient } from '../support/api-client.ts';
import { signIn, signUp, uniqueEmail, type TestAccount } from '../support/accounts.ts';
import { tokenFromLink, waitForMail } from '../support/mail-box.ts';
import { createTestApp } from '../support/test-app.ts';

const testApp = createTestApp();
const { app, ctx } = testApp;
const mailDir = inject('stackEnv')['MAIL_FAKE_DIR']!;
afterAll(() => testApp.close());

async function makeAdmin(account: TestAccount): Promise<void> {
  await ctx.db.update(users).set({ role: 'admin' }).where(eq(users.id, account.id));
}

describe('CSRF protection', () => {
  it('when a cookie-signed-in write lacks the X-XSRF-TOKEN header, then it is refused with 403 and nothing is created', async () => {
    const account = await signUp(app, 'csrf');
    const res = await account.client.send('post', '/api/projects', { name: 'Forged' }, { 'X-XSRF-TOKEN': '' });
    const noHeader = await account.client.send('post', '/api/projects', { name: 'Forged' }, { 'X-XSRF-TOKEN': 'x'.repeat(43) });
    expect(res.status).toBe(403);
    expect(noHeader.status).toBe(403);
    expect(noHeader.body.error.code).toBe('csrf_rejected');
    expect(noHeader.body.error.message).toMatch(/X-XSRF-TOKEN/);
    const list = await account.client.get('/api/projects');
    expect(list.body.projects).toEqual([]);
  });

  it('when the header echoes the cookie, then the same write goes through', async () => {
    const account = await signUp(app, 'csrf-ok');
    const res = await account.client.post('/api/projects', { name: 'Genuine' });
    expect(res.status).toBe(201);
  });

  it('when a write comes with a bearer token and no cookies, then no CSRF header is needed', async () => {
    const account = await signUp(app, 'csrf-bearer');
    const created = await account.client.post('/api/tokens', { name: 'cluster' });
    const script = ApiClient.withToken(app, created.body.token.token);
    const res = await script.post('/api/projects', { name: 'From a script' });
    expect(res.status).toBe(201);
    expect(script.xsrfToken).toBeUndefined();
  });

  it('when a signed-in write carries a token the attacker planted in both cookie and header, then it is refused: the token is bound to the session', async () => {
    const victim = await signUp(app, 'csrf-bound');
    const login = await request(app).post('/api/auth/login').set('Cookie', 'XSRF-TOKEN=' + 'p'.repeat(43)).set('X-XSRF-TOKEN', 'p'.repeat(43))
      .send({ email: victim.email, password: victim.password });
    expect(login.status).toBe(200);
    const cookies = ([] as string[]).concat(login.headers['set-cookie'] ?? []);
    const session = cookies.find((c) => c.startsWith('ergodic.sid='))!.split(';')[0]!;
    const bound = decodeURIComponent(cookies.find((c) => c.startsWith('XSRF-TOKEN='))!.split(';')[0]!.slice('XSRF-TOKEN='.length));
    const planted = 'q'.repeat(43);
    const forged = await request(app).post('/api/projects').set('Cookie', `${session}; XSRF-TOKEN=${planted}`).set('X-XSRF-TOKEN', planted).send({ name: 'Planted' });
    expect(forged.status).toBe(403);
    const genuine = await request(app).post('/api/projects').set('Cookie', `${session}; XSRF-TOKEN=${bound}`).set('X-XSRF-TOKEN', bound).send({ name: 'Bound' });
    expect(genuine.status).toBe(201);
    // Another session's token does not work here either.
    const other = await signUp(app, 'csrf-other');
    const borrowed = await request(app).post('/api/projects').set('Cookie', `${session}; XSRF-TOKEN=${other.client.xsrfToken}`).set('X-XSRF-TOKEN', other.client.xsrfToken!).send({ name: 'Borrowed' });
    expect(borrowed.status).toBe(403);
  });

  it('when an anonymous caller signs in without the header, then it is refused too (no login CSRF)', async () => {
    const account = await signUp(app, 'login-csrf');
    const client = new ApiClient(app);
    const res = await client.post('/api/auth/login', { email: account.email, password: account.password });
    expect(res.status).toBe(403);
  });
});

describe('password reset by e-mail', () => {
  async function requestReset(email: string) {
    const client = await new ApiClient(app).prime();
    return client.post('/api/auth/password-reset', { email });
  }

  it('when the e-mail is unknown or known, then the answer is the same 202', async () => {
    const account = await signUp(app, 'reset-same');
    const known = await requestReset(account.email);
    const unknown = await requestReset(uniqueEmail('nobody'));
    expect(known.status).toBe(202);
    expect(unknown.status).toBe(202);
    expect(known.body).toEqual(unknown.body);
    await waitForMail(mailDir, account.email);
  });

  it('when the mailed link is used, then the new password works, the old one and other sessions do not, and the link works once', async () => {
    const account = await signUp(app, 'reset');
    await requestReset(account.email);
    const mail = await waitForMail(mailDir, account.email);
    expect(mail.subject).toBe('Reset your Ergodic password');
    const token = tokenFromLink(mail.text, '/reset-password?token=');

    const client = await new ApiClient(app).prime();
    const done = await client.post('/api/auth/password-reset/confirm', { token, password: 'a-brand-new-password' });
    expect(done.status).toBe(200);
    expect(done.body.user.email).toBe(account.email);
    expect((await client.get('/api/auth/me')).status).toBe(200);
    expect((await account.client.get('/api/auth/me')).status).toBe(401);

    const again = await client.post('/api/auth/password-reset/confirm', { token, password: 'yet-another-password' });
    expect(again.status).toBe(410);
    expect(again.body.error.message).toMatch(/already used/);
    await signIn(app, account.email, 'a-brand-new-password');
    const old = await (await new ApiClient(app).prime()).post('/api/auth/login', { email: account.email, password: account.password });
    expect(old.status).toBe(401);
  });

  it('when the link has expired, then it is refused with 410 and the password stays', async () => {
    const account = await signUp(app, 'reset-late');
    await requestReset(account.email);
    const token = tokenFromLink((await waitForMail(mailDir, account.email)).text, '/reset-password?token=');
    await ctx.db.update(passwordResets).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(passwordResets.userId, account.id));
    const res = await (await new ApiClient(app).prime()).post('/api/auth/password-reset/confirm', { token, password: 'too-late-password' });
    expect(res.status).toBe(410);
    expect(res.body.error.message).toMatch(/expired/);
    await signIn(app, account.email, account.password);
  });

  it('when the token is made up or the new password too short, then the 400 says which', async () => {
    const client = await new ApiClient(app).prime();
    const made = await client.post('/api/auth/password-reset/confirm', { token: 'made-up', password: 'long-enough-pw' });
    expect(made.status).toBe(400);
    expect(made.body.error.message).toMatch(/not valid/);
    const short = await client.post('/api/auth/password-reset/confirm', { token: 'made-up', password: 'short' });
    expect(short.status).toBe(400);
    expect(short.body.error.details).toEqual([{ field: 'password', message: 'must be at least 10 characters' }]);
  });
});

describe('API tokens', () => {
  it('when a token is created, then it is shown once, listed without its secret, and works as Bearer with the owner\'s rights', async () => {
    const account = await signUp(app, 'tokens');
    const created = await account.client.post('/api/tokens', { name: 'laptop' });
    expect(created.status).toBe(201);
    const token: string = created.body.token.token;
    expect(token).toMatch(/^erg_[A-Za-z0-9_-]{43}$/);
    const list = await account.client.get('/api/tokens');
    expect(list.body.tokens).toHaveLength(1);
    expect(JSON.stringify(list.body)).not.toContain(token);
    expect(list.body.tokens[0].lastUsedAt).toBeNull();

    const me = await ApiClient.withToken(app, token).get('/api/auth/me');
    expect(me.status).toBe(200);
    expect(me.body.user.id).toBe(account.id);
    const after = await account.client.get('/api/tokens');
    expect(after.body.tokens[0].lastUsedAt).not.toBeNull();
  });

  it('when a token is revoked, then requests with it answer 401', async () => {
    const account = await signUp(app, 'revoke');
    const created = await account.client.post('/api/tokens', { name: 'old script' });
    const script = ApiClient.withToken(app, created.body.token.token);
    expect((await script.get('/api/projects')).status).toBe(200);
    expect((await account.client.delete(`/api/tokens/${created.body.token.id}`)).status).toBe(204);
    const res = await script.get('/api/projects');
    expect(res.status).toBe(401);
    expect(res.body.error.message).toMatch(/revoked/);
  });

  it('when someone else\'s token id is revoked, then it is 404 and the token keeps working', async () => {
    const owner = await signUp(app, 'token-owner');
    const other = await signUp(app, 'token-other');
    const created = await owner.client.post('/api/tokens', { name: 'mine' });
    expect((await other.client.delete(`/api/tokens/${created.body.token.id}`)).status).toBe(404);
    expect((await ApiClient.withToken(app, created.body.token.token).get('/api/auth/me')).status).toBe(200);
  });
});

describe('disabled accounts', () => {
  it('when an admin disables a user, then their session ends, their tokens are revoked for good, and sign-in says the account is disabled', async () => {
    const admin = await signUp(app, 'admin');
    await makeAdmin(admin);
    const user = await signUp(app, 'to-disable');
    const token = (await user.client.post('/api/tokens', { name: 'cli' })).body.token.token as string;

    const res = await admin.client.patch(`/api/admin/users/${user.id}`, { disabled: true });
    expect(res.status).toBe(200);
    expect(res.body.user.disabled).toBe(true);

    expect((await user.client.get('/api/auth/me')).status).toBe(401);
    expect((await ApiClient.withToken(app, token).get('/api/auth/me')).status).toBe(401);
    const login = await (await new ApiClient(app).prime()).post('/api/auth/login', { email: user.email, password: user.password });
    expect(login.status).toBe(403);
    expect(login.body.error.message).toMatch(/disabled/);

    // Enabled again, the account signs in, but its old tokens stay revoked and say why.
    await admin.client.patch(`/api/admin/users/${user.id}`, { disabled: false });
    const back = await signIn(app, user.email, user.password);
    expect((await ApiClient.withToken(app, token).get('/api/auth/me')).status).toBe(401);
    const listed = await back.get('/api/tokens');
    expect(listed.body.tokens).toEqual([expect.objectContaining({ name: 'cli', revokedReason: 'account_disabled', revokedAt: expect.any(String) })]);
  });

  it('when the only active admin would lose admin rights, then it is refused with 409', async () => {
    const admin = await signUp(app, 'lone-admin');
    await makeAdmin(admin);
    const otherAdmins = await ctx.db.select({ id: users.id }).from(users).where(eq(users.role, 'admin'));
    // Leave exactly one active admin for the check, then restore the others.
    const others = otherAdmins.map((u) => u.id).filter((id) => id !== admin.id);
    if (others.length) await ctx.db.update(users).set({ role: 'member' }).where(inArray(users.id, others));
    try {
      const res = await admin.client.patch(`/api/admin/users/${admin.id}`, { role: 'member' });
      expect(res.status).toBe(409);
      expect(res.body.error.message).toMatch(/at least one active site admin/);
    } finally {
      if (others.length) await ctx.db.update(users).set({ role: 'admin' }).where(inArray(users.id, others));
    }
  });

  it('when a member asks for the admin pages, then 403; when PATCH has no change, then 400 says what to send', async () => {
    const member = await signUp(app, 'not-admin');
    expect((await member.client.get('/api/admin/users')).status).toBe(403);
    const admin = await signUp(app, 'admin-empty');
    await makeAdmin(admin);
    const res = await admin.client.patch(`/api/admin/users/${member.id}`, {});
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/send role, disabled or both/);
  });
});

describe('dev mail page', () => {
  it('when MAIL_FAKE_DIR is set, then an admin sees the sent messages; when not, then 404', async () => {
    const admin = await signUp(app, 'mail-admin');
    await makeAdmin(admin);
    const res = await admin.client.get('/api/admin/mail');
    expect(res.status).toBe(200);
    expect(res.body.messages.length).toBeGreaterThan(0);
    expect(res.body.messages[0]).toEqual(expect.objectContaining({ id: expect.stringMatching(/\.eml$/), to: expect.any(String), subject: expect.any(String) }));

    const withoutFake = createTestApp({ MAIL_FAKE_DIR: '' });
    try {
      const client = await signIn(withoutFake.app, admin.email, admin.password);
      const off = await client.get('/api/admin/mail');
      expect(off.status).toBe(404);
      expect(off.body.error.message).toMatch(/MAIL_FAKE_DIR/);
    } finally {
      await withoutFake.close();
    }
  });
});
