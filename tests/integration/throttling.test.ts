import { sql } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { passwordHashGate } from '../../server/services/hash-gate.ts';
import { SIGN_IN_LIMITS } from '../../server/services/sign-in-limit.ts';
import { ApiClient } from '../support/api-client.ts';
import { uniqueEmail } from '../support/accounts.ts';
import { insertReportFixture } from '../support/report-fixtures.ts';
import { createTestApp } from '../support/test-app.ts';

// Every limit at a tenth of its production value, so each is reached in a few requests.
const limited = createTestApp({ TRUST_PROXY: 'true', RATE_LIMIT_FACTOR: '0.1' });
const { app, ctx } = limited;
afterAll(() => limited.close());

let nextAddress = 0;
/** A documentation-range address no other test uses, so counts start at zero. */
const freshAddress = () => `198.18.${Math.floor(nextAddress / 250)}.${(nextAddress++ % 250) + 1}`;

async function anonymousFrom(ip: string): Promise<ApiClient> {
  const client = new ApiClient(app);
  await client.send('get', '/api/health', undefined, { 'X-Forwarded-For': ip });
  return client;
}

/** A new account, signed up from an address of its own so the sign-up limit is not what is being tested. */
async function signUp(_app: unknown, label: string) {
  const ip = freshAddress();
  const client = await anonymousFrom(ip);
  const email = uniqueEmail(label);
  const password = `pw-${label}-0123456789`;
  const res = await client.send('post', '/api/auth/register', { email, password, displayName: label }, { 'X-Forwarded-For': ip });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return { client, id: res.body.user.id as number, email, password };
}

async function signInFrom(ip: string, email: string, password: string) {
  return (await anonymousFrom(ip)).send('post', '/api/auth/login', { email, password }, { 'X-Forwarded-For': ip });
}

describe('sign-in throttling holds under bursts', () => {
  it(`when 25 wrong passwords for one account arrive at once from one address, then exactly ${SIGN_IN_LIMITS.perAccountAndAddress} are judged and the owner still signs in from elsewhere`, async () => {
    const owner = await signUp(app, 'burst-target');
    const attacker = freshAddress();
    const clients = await Promise.all(Array.from({ length: 25 }, () => anonymousFrom(attacker)));
    let maxHashing = 0;
    const sampler = setInterval(() => { maxHashing = Math.max(maxHashing, passwordHashGate.inUse); }, 2);
    const answers = await Promise.all(clients.map((c) => c.send('post', '/api/auth/login', { email: owner.email, password: 'not-the-password' }, { 'X-Forwarded-For': attacker })));
    clearInterval(sampler);
    const statuses = answers.map((a) => a.status).sort();
    expect(statuses.filter((s) => s === 401)).toHaveLength(SIGN_IN_LIMITS.perAccountAndAddress);
    expect(statuses.filter((s) => s === 429)).toHaveLength(25 - SIGN_IN_LIMITS.perAccountAndAddress);
    const refused = answers.find((a) => a.status === 429)!;
    expect(refused.body.error.message).toMatch(/Too many failed sign-ins for this account from your network address\. .*Try again in \d+ minutes?\./);
    expect(Number(refused.headers['retry-after'])).toBeGreaterThan(0);
    // Hashing never ran more than the gate allows, however many arrived at once.
    expect(maxHashing).toBeLessThanOrEqual(2);
    // The attacker's address stays shut for this account; the owner's own address does not.
    expect((await signInFrom(attacker, owner.email, owner.password)).status).toBe(429);
    expect((await signInFrom(freshAddress(), owner.email, owner.password)).status).toBe(200);
  });

  it(`when 60 sign-ins on different accounts arrive at once from one address, then exactly ${SIGN_IN_LIMITS.perAddress} are judged`, async () => {
    const attacker = freshAddress();
    const clients = await Promise.all(Array.from({ length: 60 }, () => anonymousFrom(attacker)));
    const answers = await Promise.all(clients.map((c) => c.send('post', '/api/auth/login', { email: uniqueEmail('spray'), password: 'guess-guess-guess' }, { 'X-Forwarded-For': attacker })));
    const statuses = answers.map((a) => a.status);
    expect(statuses.filter((s) => s === 401)).toHaveLength(SIGN_IN_LIMITS.perAddress);
    expect(statuses.filter((s) => s === 429)).toHaveLength(60 - SIGN_IN_LIMITS.perAddress);
    expect(answers.find((a) => a.status === 429)!.body.error.message).toMatch(/from your network address/);
  });

  it('when a user gets the password wrong a few times and then right, then the earlier failures are forgiven', async () => {
    const user = await signUp(app, 'forgetful');
    const ip = freshAddress();
    for (let i = 0; i < SIGN_IN_LIMITS.perAccountAndAddress - 1; i++) expect((await signInFrom(ip, user.email, 'nearly-right')).status).toBe(401);
    expect((await signInFrom(ip, user.email, user.password)).status).toBe(200);
    for (let i = 0; i < SIGN_IN_LIMITS.perAccountAndAddress - 1; i++) expect((await signInFrom(ip, user.email, 'nearly-right')).status).toBe(401);
    expect((await signInFrom(ip, user.email, user.password)).status).toBe(200);
  });

  it('when the database is migrated, then it keeps no table of sign-in attempts: they are counted in Redis alone', async () => {
    const [rows] = await ctx.db.execute(sql`SELECT table_name FROM information_schema.tables WHERE table_schema = DATABASE() AND table_name = 'sign_in_attempts'`);
    expect(rows).toEqual([]);
    const [users] = await ctx.db.execute(sql`SELECT table_name FROM information_schema.tables WHERE table_schema = DATABASE() AND table_name = 'users'`);
    expect(users).toHaveLength(1);
  });
});

describe('rate limits on the rest of the API', () => {
  it('when one address signs up past its limit, then it gets 429 saying how long to wait, with Retry-After', async () => {
    const ip = freshAddress();
    const client = await anonymousFrom(ip);
    const first = await client.send('post', '/api/auth/register', { email: uniqueEmail('rl'), password: 'long-enough-password', displayName: 'One' }, { 'X-Forwarded-For': ip });
    expect(first.status).toBe(201);
    const second = await (await anonymousFrom(ip)).send('post', '/api/auth/register', { email: uniqueEmail('rl'), password: 'long-enough-password', displayName: 'Two' }, { 'X-Forwarded-For': ip });
    expect(second.status).toBe(429);
    expect(second.body.error).toMatchObject({ code: 'rate_limited' });
    expect(second.body.error.message).toMatch(/^Too many sign-ups from your network address\. Try again in \d+ (seconds|minutes)\.$/);
    expect(Number(second.headers['retry-after'])).toBeGreaterThan(60);
    // Another address is not affected.
    const other = freshAddress();
    expect((await (await anonymousFrom(other)).send('post', '/api/auth/register', { email: uniqueEmail('rl'), password: 'long-enough-password', displayName: 'Three' }, { 'X-Forwarded-For': other })).status).toBe(201);
  });

  it('when password resets are asked for past the limit, then 429', async () => {
    const ip = freshAddress();
    const ask = async () => (await anonymousFrom(ip)).send('post', '/api/auth/password-reset', { email: uniqueEmail('nobody') }, { 'X-Forwarded-For': ip });
    expect((await ask()).status).toBe(202);
    const over = await ask();
    expect(over.status).toBe(429);
    expect(over.body.error.message).toMatch(/password-reset requests/);
  });

  it('when an account sends invitations past its limits, then one address gets at most its share and the account its total', async () => {
    const owner = await signUp(app, 'inviter');
    const projectId = (await owner.client.post('/api/projects', { name: 'Invites' })).body.project.id;
    const target = uniqueEmail('invitee');
    expect((await owner.client.post(`/api/projects/${projectId}/invitations`, { email: target, role: 'viewer' })).status).toBe(201);
    const again = await owner.client.post(`/api/projects/${projectId}/invitations`, { email: target, role: 'editor' });
    expect(again.status).toBe(429);
    expect(again.body.error.message).toMatch(/invitations to this e-mail address/);
    expect((await owner.client.post(`/api/projects/${projectId}/invitations`, { email: uniqueEmail('invitee'), role: 'viewer' })).status).toBe(201);
    const third = await owner.client.post(`/api/projects/${projectId}/invitations`, { email: uniqueEmail('invitee'), role: 'viewer' });
    expect(third.status).toBe(429);
    expect(third.body.error.message).toMatch(/invitations sent from your account/);
  });

  it('when a member comments past the limit, then 429, and the comments already made stay', async () => {
    const owner = await signUp(app, 'commenter');
    const projectId = (await owner.client.post('/api/projects', { name: 'Comments' })).body.project.id;
    const { reportId } = await insertReportFixture(ctx, projectId, owner.id);
    expect((await owner.client.post(`/api/reports/${reportId}/comments`, { body: 'one' })).status).toBe(201);
    expect((await owner.client.post(`/api/reports/${reportId}/comments`, { body: 'two' })).status).toBe(201);
    const over = await owner.client.post(`/api/reports/${reportId}/comments`, { body: 'three' });
    expect(over.status).toBe(429);
    expect(over.body.error.message).toMatch(/comments from your account/);
    expect((await owner.client.get(`/api/reports/${reportId}/comments`)).body.comments).toHaveLength(2);
  });

  it('when an access link is read past the limit from one address, then 429; another address still reads it', async () => {
    const owner = await signUp(app, 'link-reads');
    const projectId = (await owner.client.post('/api/projects', { name: 'Link reads' })).body.project.id;
    const { reportId } = await insertReportFixture(ctx, projectId, owner.id);
    const { token } = (await owner.client.post(`/api/reports/${reportId}/access-link`, { expiresInDays: 2 })).body.link;
    const ip = freshAddress();
    const reader = new ApiClient(app);
    const statuses: number[] = [];
    for (let i = 0; i < 7; i++) statuses.push((await reader.send('get', `/api/links/${token}`, undefined, { 'X-Forwarded-For': ip })).status);
    expect(statuses).toEqual([200, 200, 200, 200, 200, 200, 429]);
    const csv = await reader.send('get', `/api/links/${token}/curves/msd.csv`, undefined, { 'X-Forwarded-For': ip });
    expect(csv.status).toBe(429);
    expect((await new ApiClient(app).send('get', `/api/links/${token}`, undefined, { 'X-Forwarded-For': freshAddress() })).status).toBe(200);
  });

  it('when one account uploads past its limit, then 429 before any byte is stored', async () => {
    const owner = await signUp(app, 'uploader-rl');
    const projectId = (await owner.client.post('/api/projects', { name: 'Upload limit' })).body.project.id;
    const statuses: number[] = [];
    for (let i = 0; i < 13; i++) {
      const res = await owner.client.raw('post', `/api/projects/${projectId}/trajectories`).attach('file', Buffer.from(`1\n\nAr 0 0 ${i}\n`), `u${i}.xyz`);
      statuses.push(res.status);
    }
    expect(statuses.slice(0, 12).every((s) => s === 201)).toBe(true);
    expect(statuses[12]).toBe(429);
    expect(await ctx.store.listKeys(`projects/${projectId}/`)).toHaveLength(12);
  });
});
