import { sql } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Database } from '../../server/db/client.ts';
import { registerUser } from '../../server/services/accounts.ts';
import { ApiClient } from '../support/api-client.ts';
import { signIn, signUp, uniqueEmail } from '../support/accounts.ts';
import { createTestApp } from '../support/test-app.ts';

const testApp = createTestApp();
const { app } = testApp;
afterAll(() => testApp.close());

function sessionCookie(setCookie: string[] | string | undefined): string | undefined {
  return [setCookie ?? []].flat().find((c) => c.startsWith('ergodic.sid='))?.split(';')[0];
}

describe('sign-up, sign-in and sign-out', () => {
  // The very first account of an instance becomes admin; make sure that one exists already.
  beforeAll(() => signUp(app, 'earliest'));

  it('when someone signs up after the first account, then they are signed in, a member, and GET /api/auth/me names them', async () => {
    const account = await signUp(app, 'newcomer');
    const me = await account.client.get('/api/auth/me');
    expect(me.status).toBe(200);
    expect(me.body.user).toEqual({ id: account.id, email: account.email, displayName: account.displayName, role: 'member' });
  });

  it('when the app asks who is signed in, then GET /api/auth/session answers 200 with the user, or with null and no 401 when signed out', async () => {
    const anonymous = await new ApiClient(app).prime();
    const nobody = await anonymous.get('/api/auth/session');
    expect(nobody.status).toBe(200);
    expect(nobody.body).toEqual({ user: null });
    expect((await anonymous.get('/api/auth/me')).status).toBe(401);
    const account = await signUp(app, 'session-reader');
    const someone = await account.client.get('/api/auth/session');
    expect(someone.status).toBe(200);
    expect(someone.body.user).toEqual({ id: account.id, email: account.email, displayName: account.displayName, role: 'member' });
    await account.client.post('/api/auth/logout', {});
    expect((await account.client.get('/api/auth/session')).body).toEqual({ user: null });
  });

  it('when the e-mail is mixed case with spaces, then it is stored trimmed and lower-case and signs in either way', async () => {
    const client = await new ApiClient(app).prime();
    const email = uniqueEmail('case');
    const res = await client.post('/api/auth/register', { email: `  ${email.toUpperCase()} `, password: 'long-enough-pw', displayName: 'Case' });
    expect(res.status).toBe(201);
    expect(res.body.user.email).toBe(email);
    await signIn(app, email.toUpperCase(), 'long-enough-pw');
  });

  it('when sign-up input is bad, then the 400 names every wrong field and no account is made', async () => {
    const client = await new ApiClient(app).prime();
    const email = uniqueEmail('bad');
    const res = await client.post('/api/auth/register', { email: 'not-an-address', password: 'short', displayName: '' });
    expect(res.status).toBe(400);
    const fields = res.body.error.details.map((d: { field: string }) => d.field).sort();
    expect(fields).toEqual(['displayName', 'email', 'password']);
    expect(res.body.error.message).toContain('password: must be at least 10 characters');
    const again = await client.post('/api/auth/register', { email, password: 'long-enough-pw', displayName: 'Fine' });
    expect(again.status).toBe(201);
  });

  it('when a display name or project name holds CR/LF or a right-to-left override, then 400 names the field, the character and its place, and nothing is made', async () => {
    const client = await new ApiClient(app).prime();
    const email = uniqueEmail('names');
    for (const [displayName, problem] of [
      ['Eve\r\nBcc: everyone', 'a control character (U+000D) at position 4'],
      ['Mallory\u202Etxt.exe', 'a text-direction control character (U+202E) at position 8'],
    ] as const) {
      const res = await client.post('/api/auth/register', { email, password: 'long-enough-pw', displayName });
      expect(res.status).toBe(400);
      expect(res.body.error.details).toEqual([{ field: 'displayName', message: `must not contain ${problem}` }]);
    }
    const account = await signUp(app, 'names-ok');
    const project = await account.client.post('/api/projects', { name: 'Quartz\u2066 runs' });
    expect(project.status).toBe(400);
    expect(project.body.error.message).toBe('name: must not contain a text-direction control character (U+2066) at position 7');
    // Letters of every script and accents are names like any other.
    const fine = await client.post('/api/auth/register', { email, password: 'long-enough-pw', displayName: 'Zoë Øster-Ångström 王' });
    expect(fine.status).toBe(201);
  });

  it('when the e-mail is taken, then sign-up answers 409', async () => {
    const account = await signUp(app, 'taken');
    const client = await new ApiClient(app).prime();
    const res = await client.post('/api/auth/register', { email: account.email, password: 'another-password', displayName: 'X' });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/already exists/);
  });

  it('when a user signs in, then the session id changes (no fixation) and the cookie is HttpOnly and SameSite=Lax', async () => {
    const account = await signUp(app, 'fixation');
    const client = await new ApiClient(app).prime();
    const before = await client.post('/api/auth/login', { email: account.email, password: 'wrong-password-here' });
    expect(before.status).toBe(401);
    const first = await client.post('/api/auth/login', { email: account.email, password: account.password });
    const second = await client.post('/api/auth/login', { email: account.email, password: account.password });
    const a = sessionCookie(first.headers['set-cookie']);
    const b = sessionCookie(second.headers['set-cookie']);
    expect(a).toBeDefined();
    expect(b).toBeDefined();
    expect(a).not.toBe(b);
    const raw = [first.headers['set-cookie'] ?? []].flat().find((c) => c.startsWith('ergodic.sid='))!;
    expect(raw).toMatch(/HttpOnly/i);
    expect(raw).toMatch(/SameSite=Lax/i);
    expect(raw).not.toMatch(/Secure/i);
  });

  it('when PUBLIC_URL is https behind a TLS proxy, then the session and XSRF cookies are Secure', async () => {
    const tls = createTestApp({ PUBLIC_URL: 'https://ergodic.example', TRUST_PROXY: 'true' });
    try {
      // A Secure cookie never travels back over plain http, so the XSRF pair is sent by hand.
      const primed = await request(tls.app).get('/api/health');
      const xsrf = [primed.headers['set-cookie'] ?? []].flat().find((c) => c.startsWith('XSRF-TOKEN='))!.split(';')[0]!;
      expect([primed.headers['set-cookie'] ?? []].flat().join()).toMatch(/XSRF-TOKEN=[^;]+;.*Secure/i);
      const res = await request(tls.app).post('/api/auth/register').set('X-Forwarded-Proto', 'https').set('Cookie', xsrf).set('X-XSRF-TOKEN', xsrf.split('=')[1]!)
        .send({ email: uniqueEmail('tls'), password: 'long-enough-pw', displayName: 'Over TLS' });
      expect(res.status).toBe(201);
      const raw = [res.headers['set-cookie'] ?? []].flat().find((c) => c.startsWith('ergodic.sid='))!;
      expect(raw).toMatch(/;\s*Secure/i);
    } finally {
      await tls.close();
    }
  });

  it('when a user signs out, then the same cookies no longer reach signed-in routes', async () => {
    const account = await signUp(app, 'leaver');
    expect((await account.client.post('/api/auth/logout')).status).toBe(204);
    const me = await account.client.get('/api/auth/me');
    expect(me.status).toBe(401);
  });

  it('when the password is wrong or the account unknown, then both answer the same 401', async () => {
    const account = await signUp(app, 'wrongpw');
    const client = await new ApiClient(app).prime();
    const wrong = await client.post('/api/auth/login', { email: account.email, password: 'not-the-password' });
    const unknown = await client.post('/api/auth/login', { email: uniqueEmail('ghost'), password: 'not-the-password' });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body.error.message).toBe(unknown.body.error.message);
  });
});

describe('the first account', () => {
  it('when the users table is empty, then the first sign-up becomes site admin and the second a member', async () => {
    // Inside a rolled-back transaction, so the shared test database keeps its users.
    const roles: string[] = [];
    await testApp.ctx.db.transaction(async (tx) => {
      await tx.execute(sql`SET FOREIGN_KEY_CHECKS = 0`);
      await tx.execute(sql`DELETE FROM users`);
      const db = tx as unknown as Database;
      roles.push((await registerUser(db, { email: uniqueEmail('first'), password: 'irrelevant-here', displayName: 'First' })).role);
      roles.push((await registerUser(db, { email: uniqueEmail('second'), password: 'irrelevant-here', displayName: 'Second' })).role);
      await tx.execute(sql`SET FOREIGN_KEY_CHECKS = 1`);
      tx.rollback();
    }).catch((err: unknown) => {
      if (!(err instanceof Error && err.message.includes('Rollback'))) throw err;
    });
    expect(roles).toEqual(['admin', 'member']);
  });
});
