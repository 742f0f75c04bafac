import { readFileSync } from 'node:fs';
import request from 'supertest';
import { afterAll, describe, expect, it } from 'vitest';
import { ANALYSIS_KEYS } from '../../shared/analysis-params.ts';
import type { OpenApiDocument } from '../../server/routes/openapi-document.ts';
import { openApiPath } from '../../server/routes/openapi-document.ts';
import { routeTable } from '../../server/routes/index.ts';
import type { Access } from '../../server/routes/route-table.ts';
import { createTestApp } from '../support/test-app.ts';

/**
 * GET /api/openapi.json is generated from the route table; these checks hold it
 * to the table and to the README's route list, so neither can gain a route the
 * document lacks, and every route keeps its access rule.
 */
const testApp = createTestApp();
const table = routeTable(testApp.ctx);
afterAll(() => testApp.close());

async function fetchDocument(): Promise<OpenApiDocument> {
  const res = await request(testApp.app).get('/api/openapi.json');
  expect(res.status).toBe(200);
  expect(res.headers['content-type']).toMatch(/application\/json/);
  return res.body as OpenApiDocument;
}

/** `GET /api/reports/{}/curves/{}.csv`: parameter names differ between README and code, positions do not. */
const routeKey = (method: string, path: string) => `${method.toUpperCase()} ${path.split('?')[0]!.replace(/[:{](\w+)}?/g, '{}')}`;

/** The README's words for an access rule: public, signed-in, admin, or the least project role. */
const accessWord = (access: Access) => (access.kind === 'project' ? access.role : access.kind);

function readmeRoutes(): Map<string, string> {
  const readme = readFileSync(new URL('../../README.md', import.meta.url), 'utf8');
  const rows = [...readme.matchAll(/^\| `(GET|POST|PATCH|PUT|DELETE) (\/api\/[^`]+)` \| ([^|]+?) \|/gm)];
  return new Map(rows.map(([, method, path, access]) => [routeKey(method!, path!), access!.trim()]));
}

describe('GET /api/openapi.json', () => {
  it('when fetched without signing in, then it is an OpenAPI 3.1 document with security schemes for sessions and tokens', async () => {
    const doc = await fetchDocument();
    expect(doc.openapi).toBe('3.1.0');
    expect(doc.info.title).toBe('Ergodic API');
    expect(Object.keys(doc.components.securitySchemes).sort()).toEqual(['apiToken', 'session']);
  });

  it('when a route is in the route table, then the document has it with its access rule, a summary and its success answer', async () => {
    const doc = await fetchDocument();
    const missing: string[] = [];
    for (const def of table) {
      const op = doc.paths[openApiPath(def.path)]?.[def.method];
      if (!op) {
        missing.push(`${def.method.toUpperCase()} /api${def.path}`);
        continue;
      }
      expect(op['x-access'], def.path).toEqual(def.access);
      expect(op.description).toMatch(/^Access: /);
      expect(op.summary.length).toBeGreaterThan(5);
      expect(op.responses[String(def.response.status)], `${def.method} ${def.path}`).toBeDefined();
      const security = { public: [], session: [{ session: [] }] }[def.access.kind as 'public' | 'session'] ?? [{ session: [] }, { apiToken: [] }];
      expect(op.security, def.path).toEqual(security);
    }
    expect(missing).toEqual([]);
    const documented = Object.values(doc.paths).reduce((n, ops) => n + Object.keys(ops).length, 0);
    expect(documented).toBe(table.length);
  });

  it('when a route is listed in the README, then the document has it with the same access rule, and the README lists every documented route', async () => {
    const doc = await fetchDocument();
    const documented = new Map<string, string>();
    for (const [path, ops] of Object.entries(doc.paths)) {
      for (const [method, op] of Object.entries(ops)) documented.set(routeKey(method, path), accessWord(op['x-access']));
    }
    const readme = readmeRoutes();
    expect(readme.size).toBeGreaterThan(40);
    const notDocumented = [...readme.keys()].filter((k) => !documented.has(k));
    const notInReadme = [...documented.keys()].filter((k) => !readme.has(k));
    const accessDiffers = [...readme].filter(([k, access]) => documented.has(k) && documented.get(k) !== access)
      .map(([k, access]) => `${k}: README says ${access}, the route table ${documented.get(k)}`);
    expect({ notDocumented, notInReadme, accessDiffers }).toEqual({ notDocumented: [], notInReadme: [], accessDiffers: [] });
  });

  it('when a route answers JSON, then its value sits in one key: plural for a list, singular for one resource', async () => {
    const doc = await fetchDocument();
    const wrong: string[] = [];
    for (const def of table) {
      if (def.response.kind !== 'json') continue;
      const op = doc.paths[openApiPath(def.path)]![def.method]!;
      const schema = (op.responses[String(def.response.status)] as { content: Record<string, { schema: Record<string, unknown> }> })
        .content['application/json']!.schema;
      const { key } = def.response;
      const value = (schema['properties'] as Record<string, { type?: string }>)[key];
      expect(schema['required']).toEqual([key]);
      const isList = value?.type === 'array';
      // "series" is one word for one and for many: {series} and {series: [...]} both read right.
      if (key !== 'series' && isList !== key.endsWith('s')) wrong.push(`${def.method.toUpperCase()} ${def.path}: {${key}} holds ${isList ? 'a list' : 'one value'}`);
    }
    expect(wrong).toEqual([]);
  });

  it('when a request body is documented, then it is the JSON Schema of the zod schema the handler parses with', async () => {
    const doc = await fetchDocument();
    const create = doc.paths['/api/projects']!['post']!.requestBody as { content: { 'application/json': { schema: Record<string, unknown> } } };
    expect(create.content['application/json'].schema).toEqual(expect.objectContaining({
      type: 'object', required: ['name'], additionalProperties: false,
      properties: expect.objectContaining({ name: expect.objectContaining({ type: 'string', minLength: 1, maxLength: 160 }) }),
    }));
    const start = doc.paths['/api/trajectories/{id}/analyses']!['post']!.requestBody as { content: { 'application/json': { schema: { properties: { analyses: { items: { enum: string[] } } } } } } };
    expect(start.content['application/json'].schema.properties.analyses.items.enum).toEqual([...ANALYSIS_KEYS]);
    const upload = doc.paths['/api/projects/{id}/trajectories']!['post']!.requestBody as { content: Record<string, unknown> };
    expect(Object.keys(upload.content)).toEqual(['multipart/form-data']);
    const frames = doc.paths['/api/trajectories/{id}/frames']!['get']!.parameters!.map((p) => `${String(p['in'])}:${String(p['name'])}`);
    expect(frames).toEqual(['path:id', 'query:from', 'query:to', 'query:stride']);
  });
});
