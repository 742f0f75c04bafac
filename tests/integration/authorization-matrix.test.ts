import { randomUUID } from 'node:crypto';
import { eq, inArray } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sha256Hex } from '../../server/auth/secret-token.ts';
import { accessLinks, apiTokens, invitations, projectMembers, projects, users } from '../../server/db/schema/index.ts';
import { routeTable } from '../../server/routes/index.ts';
import type { Access, ResourceKind, RouteDef } from '../../server/routes/route-table.ts';
import { accessOfGuard, isSharedMiddleware } from '../../server/routes/stack-marks.ts';
import { ApiClient } from '../support/api-client.ts';
import { signIn, signUp, type TestAccount } from '../support/accounts.ts';
import { insertReportFixture } from '../support/report-fixtures.ts';
import { appLayers, isRouter, routerLayers } from '../support/router-stack.ts';
import { createTestApp } from '../support/test-app.ts';

/**
 * Walks every route of the route table for every kind of caller and checks
 * the status against what the route's Access rule promises. Writes carry an
 * empty body: a 400 from validation still proves the rule let the caller in.
 * Each check gets a fresh project, so destructive routes cannot spoil the next.
 */
const testApp = createTestApp();
const { app, ctx } = testApp;
const table = routeTable(ctx);
afterAll(() => testApp.close());

const personaNames = ['anonymous', 'non-member', 'viewer', 'editor', 'owner', 'admin (not a member)', 'bearer token of the owner', 'access-link holder'] as const;
type Persona = (typeof personaNames)[number];
type Verdict = 'allowed' | 401 | 403 | 404;

const RANK = { viewer: 1, editor: 2, owner: 3 } as const;
const MEMBER_ROLE: Partial<Record<Persona, keyof typeof RANK>> = {
  viewer: 'viewer', editor: 'editor', owner: 'owner', 'bearer token of the owner': 'owner',
};

/** What a route's rule promises each caller; a rule the matrix does not know fails the test. */
function expectedVerdict(route: RouteDef, persona: Persona): Verdict {
  const access: Access = route.access;
  const anonymous = persona === 'anonymous' || persona === 'access-link holder';
  switch (access.kind) {
    case 'public':
      return 'allowed';
    case 'signed-in':
      return anonymous ? 401 : 'allowed';
    case 'session':
      if (anonymous) return 401;
      return persona === 'bearer token of the owner' ? 403 : 'allowed';
    case 'admin':
      if (anonymous) return 401;
      return persona === 'admin (not a member)' ? 'allowed' : 403;
    case 'project': {
      if (anonymous) return 401;
      const role = MEMBER_ROLE[persona];
      if (!role) return 404;
      return RANK[role] >= RANK[access.role] ? 'allowed' : 403;
    }
    default:
      throw new Error(`${route.method.toUpperCase()} ${route.path} has an access rule the matrix does not understand: ${JSON.stringify(access)}`);
  }
}

function kindName(kind: ResourceKind): string {
  return kind[0]!.toUpperCase() + kind.slice(1);
}

/** Turns a response into the verdict it shows; only authorize()'s own 404 counts as "cannot see". */
function observedVerdict(route: RouteDef, status: number, message: unknown): Verdict {
  if (status === 401 || status === 403) return status;
  if (status === 404 && route.access.kind === 'project' && message === `${kindName(route.access.via)} not found.`) return 404;
  return 'allowed';
}

interface World {
  ids: Record<ResourceKind, number>;
  named: Record<string, string>;
}

interface Cast {
  accounts: Record<'nonMember' | 'viewer' | 'editor' | 'owner' | 'admin', TestAccount>;
  bearer: string;
}

let cast: Cast;
const clients = new Map<Persona, ApiClient>();

/** One project with one of everything, and the secrets that name its shareable parts. */
async function createWorld(): Promise<World> {
  const { owner, editor, viewer } = cast.accounts;
  const [{ id: projectId }] = await ctx.db.insert(projects).values({ name: 'Matrix project', createdBy: owner.id, lastActivityAt: new Date() }).$returningId();
  await ctx.db.insert(projectMembers).values([
    { projectId, userId: owner.id, role: 'owner' }, { projectId, userId: editor.id, role: 'editor' }, { projectId, userId: viewer.id, role: 'viewer' },
  ]);
  const fixture = await insertReportFixture(ctx, projectId, owner.id);
  const linkToken = `matrix-link-${randomUUID()}`;
  const [{ id: linkId }] = await ctx.db.insert(accessLinks).values({
    projectId, reportId: fixture.reportId, tokenHash: sha256Hex(linkToken), createdBy: owner.id, expiresAt: new Date(Date.now() + 86_400_000),
  }).$returningId();
  const invitationToken = `matrix-invitation-${randomUUID()}`;
  const [{ id: invitationId }] = await ctx.db.insert(invitations).values({
    projectId, email: `matrix-${randomUUID().slice(0, 8)}@ergodic-test.example`, role: 'viewer', tokenHash: sha256Hex(invitationToken),
    invitedBy: owner.id, expiresAt: new Date(Date.now() + 86_400_000),
  }).$returningId();
  const [{ id: tokenId }] = await ctx.db.insert(apiTokens).values({
    userId: owner.id, name: 'spare', tokenHash: sha256Hex(`erg_spare-${randomUUID()}`), prefix: 'erg_spare',
  }).$returningId();
  const ids: Record<ResourceKind, number> = {
    project: projectId, trajectory: fixture.trajectoryId, report: fixture.reportId, job: fixture.runId, series: fixture.seriesId,
  };
  const named: Record<string, string> = {
    token: linkToken, invitationToken, linkId: String(linkId), invitationId: String(invitationId), tokenId: String(tokenId),
    userId: String(editor.id), curve: 'msd',
  };
  for (const [kind, id] of Object.entries(ids)) named[`${kind}Id`] = String(id);
  return { ids, named };
}

/**
 * A successful answer must have the shape the route table (and so the API
 * document) promises: JSON wrapped in its one key, the value as its schema says.
 */
function contractProblem(route: RouteDef, status: number, body: unknown): string | null {
  if (status < 200 || status > 299) return null;
  const { response } = route;
  if (response.kind === 'empty') return status === 204 ? null : `answered ${status}, documented 204`;
  if (response.kind === 'file') {
    const parsed = response.schema?.safeParse(body);
    return parsed && !parsed.success ? `download does not match its schema: ${parsed.error.message}` : null;
  }
  if (status !== response.status) return `answered ${status}, documented ${response.status}`;
  const keys = typeof body === 'object' && body !== null ? Object.keys(body) : [];
  if (keys.length !== 1 || keys[0] !== response.key) return `answer keys ${JSON.stringify(keys)}, documented {${response.key}}`;
  const parsed = response.schema.safeParse((body as Record<string, unknown>)[response.key]);
  return parsed.success ? null : `{${response.key}} does not match its schema: ${parsed.error.message}`;
}

/** Fills `:param`s: the rule's own param from its resource kind, the others by name. */
function fillPath(route: RouteDef, world: World): string {
  const ruleParam = route.access.kind === 'project' ? (route.access.param ?? 'id') : null;
  return `/api${route.path.replace(/:(\w+)/g, (_, name: string) => {
    if (route.access.kind === 'project' && name === ruleParam) return String(world.ids[route.access.via]);
    const value = world.named[name];
    if (value === undefined) throw new Error(`${route.method.toUpperCase()} ${route.path}: the matrix has no fixture for :${name}; add one to createWorld()`);
    return value;
  })}`;
}

async function clientFor(persona: Persona): Promise<ApiClient> {
  const existing = clients.get(persona);
  if (existing) return existing;
  const fresh = persona === 'bearer token of the owner' ? ApiClient.withToken(app, cast.bearer) : await new ApiClient(app).prime();
  clients.set(persona, fresh);
  return fresh;
}

const SIGNED_IN: Partial<Record<Persona, keyof Cast['accounts']>> = {
  'non-member': 'nonMember', viewer: 'viewer', editor: 'editor', owner: 'owner', 'admin (not a member)': 'admin',
};

/** Signs a session persona back in if a route (sign-out, reset) ended its session. */
async function restore(persona: Persona): Promise<void> {
  const key = SIGNED_IN[persona];
  if (!key) return;
  const client = await clientFor(persona);
  if ((await client.get('/api/auth/me')).status === 200) return;
  const account = cast.accounts[key];
  clients.set(persona, await signIn(app, account.email, account.password));
}

beforeAll(async () => {
  const accounts = {
    nonMember: await signUp(app, 'matrix-outsider'), viewer: await signUp(app, 'matrix-viewer'), editor: await signUp(app, 'matrix-editor'),
    owner: await signUp(app, 'matrix-owner'), admin: await signUp(app, 'matrix-admin'),
  };
  // Roles set outright: on an empty database the first sign-up would otherwise be admin.
  await ctx.db.update(users).set({ role: 'member' }).where(inArray(users.id, [accounts.nonMember.id, accounts.viewer.id, accounts.editor.id, accounts.owner.id]));
  await ctx.db.update(users).set({ role: 'admin' }).where(eq(users.id, accounts.admin.id));
  const bearer = (await accounts.owner.client.post('/api/tokens', { name: 'matrix' })).body.token.token as string;
  cast = { accounts, bearer };
  for (const [persona, key] of Object.entries(SIGNED_IN) as [Persona, keyof Cast['accounts']][]) clients.set(persona, accounts[key].client);
}, 120_000);

describe('authorization matrix over the whole route table', () => {
  it('has routes of every access kind to walk', () => {
    const kinds = new Set(table.map((r) => r.access.kind));
    expect([...kinds].sort()).toEqual(['admin', 'project', 'public', 'session', 'signed-in']);
  });

  for (const route of table) {
    it(`${route.method.toUpperCase()} /api${route.path} (${JSON.stringify(route.access)})`, async () => {
      const problems: string[] = [];
      for (const persona of personaNames) {
        const expected = expectedVerdict(route, persona);
        const world = await createWorld();
        const client = await clientFor(persona);
        const path = fillPath(route, world);
        const res = await client.send(route.method, path, route.method === 'get' ? undefined : {});
        const observed = observedVerdict(route, res.status, res.body?.error?.message);
        if (observed !== expected) problems.push(`${persona}: expected ${expected}, got ${res.status} ${JSON.stringify(res.body?.error ?? '')}`);
        const contract = contractProblem(route, res.status, res.body);
        if (contract) problems.push(`${persona}: ${contract}`);
        await restore(persona);
      }
      expect(problems).toEqual([]);
    }, 60_000);
  }

  it('when the access-link holder uses the link, then it reads the report, and the same client is 401 on the report\'s member routes', async () => {
    const world = await createWorld();
    const holder = await clientFor('access-link holder');
    const read = await holder.get(`/api/links/${world.named['token']}`);
    expect(read.status).toBe(200);
    expect(read.body.link.report.id).toBe(world.ids.report);
    expect((await holder.get(`/api/reports/${world.ids.report}/comments`)).status).toBe(401);
  });
});

describe('the API router holds nothing but the route table', () => {
  it('when the app is built, then every /api layer is the table\'s router or the JSON 404, and the app has no routes of its own', () => {
    const layers = appLayers(app);
    expect(layers.filter((l) => l.route)).toEqual([]);
    const apiLayers = layers.filter((l) => l.rawPath === '/api');
    expect(apiLayers).toHaveLength(2);
    expect(isRouter(apiLayers[0]!.handle)).toBe(true);
    expect(apiLayers[1]!.name).toBe('notFoundHandler');
  });

  it('when the API router is inspected, then each route is a table entry with its own access guard first, and every other layer is shared middleware', () => {
    const apiLayer = appLayers(app).find((l) => l.rawPath === '/api' && isRouter(l.handle))!;
    const stranger: string[] = [];
    const seen = new Set<string>();
    for (const layer of routerLayers(apiLayer.handle)) {
      if (!layer.route) {
        if (!isSharedMiddleware(layer.handle)) stranger.push(`middleware ${layer.name} at ${String(layer.rawPath)}`);
        continue;
      }
      const methods = Object.keys(layer.route.methods);
      for (const method of methods) {
        const key = `${method} ${layer.route.path}`;
        const entry = table.find((r) => r.method === method && r.path === layer.route!.path);
        const guard = accessOfGuard(layer.route.stack[0]?.handle);
        if (!entry) stranger.push(`${key}: not in routeTable()`);
        else if (!guard || JSON.stringify(guard) !== JSON.stringify(entry.access)) stranger.push(`${key}: first handler is not its access guard`);
        seen.add(key);
      }
    }
    expect(stranger).toEqual([]);
    expect([...seen].sort()).toEqual(table.map((r) => `${r.method} ${r.path}`).sort());
  });
});
