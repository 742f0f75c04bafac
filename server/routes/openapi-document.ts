/**
 * The OpenAPI 3.1 document, built from the route table and the shared zod
 * schemas the handlers parse with, so it cannot drift from what the server does.
 * OpenAPI 3.1 schema objects are JSON Schema 2020-12, which zod 4 writes itself.
 */
import { z } from 'zod';
import { SESSION_COOKIE } from '../auth/session.ts';
import type { Access, RouteDef, RouteRequest, RouteResponse } from './route-table.ts';

type JsonSchema = Record<string, unknown>;

export interface OpenApiOperation {
  operationId: string;
  summary: string;
  description: string;
  /** The route's access rule, as the route table states it. */
  'x-access': Access;
  security: Record<string, string[]>[];
  parameters?: JsonSchema[];
  requestBody?: JsonSchema;
  responses: Record<string, JsonSchema>;
}

export interface OpenApiDocument {
  openapi: '3.1.0';
  info: { title: string; version: string; description: string };
  servers: { url: string }[];
  paths: Record<string, Record<string, OpenApiOperation>>;
  components: { schemas: Record<string, JsonSchema>; securitySchemes: Record<string, JsonSchema> };
}

const errorSchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string().meta({ description: 'What went wrong and where, fit to show a person.' }),
    details: z.unknown().optional(),
  }),
});

function jsonSchema(schema: z.ZodType, io: 'input' | 'output'): JsonSchema {
  const { $schema: _dialect, ...rest } = z.toJSONSchema(schema, { io, target: 'draft-2020-12', unrepresentable: 'any' }) as JsonSchema;
  return rest;
}

/** `/reports/:id/curves/:curve.csv` → `/api/reports/{id}/curves/{curve}.csv` */
export function openApiPath(expressPath: string): string {
  return `/api${expressPath.replace(/:(\w+)/g, '{$1}')}`;
}

export function describeAccess(access: Access): string {
  switch (access.kind) {
    case 'public': return 'public: anyone, signed in or not';
    case 'signed-in': return 'signed-in: any active account, by session or API token';
    case 'session': return 'session: a signed-in browser session only; an API token gets 403';
    case 'admin': return 'admin: site admins only';
    case 'project': return `${access.role}: at least ${access.role} in the project the ${access.via} belongs to (others get 404)`;
  }
}

function security(access: Access): Record<string, string[]>[] {
  if (access.kind === 'public') return [];
  return access.kind === 'session' ? [{ session: [] }] : [{ session: [] }, { apiToken: [] }];
}

function pathParameters(path: string, access: Access): JsonSchema[] {
  return [...path.matchAll(/:(\w+)/g)].map(([, name]) => {
    const isId = name === 'id' || name!.endsWith('Id');
    const scoped = access.kind === 'project' && (access.param ?? 'id') === name ? ` of the ${access.via}` : '';
    return {
      name, in: 'path', required: true,
      description: isId ? `id${scoped}` : name === 'curve' ? 'curve name, e.g. msd, vacf, vdos, rdf' : 'a token as sent in its link',
      schema: isId ? { type: 'integer', minimum: 1 } : { type: 'string', minLength: 1, maxLength: 200 },
    };
  });
}

function queryParameters(request: RouteRequest | undefined): JsonSchema[] {
  if (!request?.query) return [];
  const schema = jsonSchema(request.query, 'input');
  const properties = (schema['properties'] ?? {}) as Record<string, JsonSchema>;
  const required = new Set((schema['required'] ?? []) as string[]);
  return Object.entries(properties).map(([name, property]) => ({ name, in: 'query', required: required.has(name), schema: property }));
}

function requestBody(request: RouteRequest | undefined): JsonSchema | undefined {
  if (request?.body) return { required: true, content: { 'application/json': { schema: jsonSchema(request.body, 'input') } } };
  if (request?.upload) {
    const fields = jsonSchema(request.upload.fields, 'input');
    const properties = { [request.upload.fileField]: { type: 'string', contentMediaType: 'application/octet-stream' }, ...(fields['properties'] as JsonSchema) };
    return {
      required: true,
      content: { 'multipart/form-data': { schema: { type: 'object', required: [request.upload.fileField], properties } } },
    };
  }
  return undefined;
}

function successResponse(response: RouteResponse): [string, JsonSchema] {
  switch (response.kind) {
    case 'empty':
      return ['204', { description: 'Done; no content.' }];
    case 'json': {
      const schema = { type: 'object', required: [response.key], properties: { [response.key]: jsonSchema(response.schema, 'output') } };
      return [String(response.status), { description: `\`{${response.key}}\``, content: { 'application/json': { schema } } }];
    }
    case 'file': {
      const schema = response.schema ? jsonSchema(response.schema, 'output') : { type: 'string' };
      return ['200', { description: response.description, content: { [response.contentType]: { schema } } }];
    }
  }
}

function operation(def: RouteDef): OpenApiOperation {
  const [status, success] = successResponse(def.response);
  const parameters = [...pathParameters(def.path, def.access), ...queryParameters(def.request)];
  const body = requestBody(def.request);
  return {
    operationId: `${def.method}${def.path.replace(/[^\w]+(\w)?/g, (_m, c: string | undefined) => (c ? c.toUpperCase() : ''))}`,
    summary: def.summary,
    description: `Access: ${describeAccess(def.access)}.`,
    'x-access': def.access,
    security: security(def.access),
    ...(parameters.length ? { parameters } : {}),
    ...(body ? { requestBody: body } : {}),
    responses: {
      [status]: success,
      default: { description: 'An error: `{error: {code, message, details?}}`.', content: { 'application/json': { schema: { $ref: '#/components/schemas/Error' } } } },
    },
  };
}

/** One document for the whole table; every route appears with its access rule. */
export function buildOpenApiDocument(table: readonly RouteDef[], version: string): OpenApiDocument {
  const paths: OpenApiDocument['paths'] = {};
  for (const def of table) {
    const path = openApiPath(def.path);
    paths[path] ??= {};
    if (paths[path][def.method]) throw new Error(`Two routes for ${def.method.toUpperCase()} ${path}`);
    paths[path][def.method] = operation(def);
  }
  return {
    openapi: '3.1.0',
    info: {
      title: 'Ergodic API',
      version,
      description: 'Molecular-dynamics trajectories, analyses and reports. JSON answers wrap their value in one key: '
        + 'a list as `{<plural>: [...]}`, one resource as `{<singular>: {...}}`; downloads are plain files. Dates are ISO 8601 strings. '
        + 'Resources in projects you are not a member of answer 404.',
    },
    servers: [{ url: '/' }],
    paths,
    components: {
      schemas: { Error: jsonSchema(errorSchema, 'output') },
      securitySchemes: {
        session: {
          type: 'apiKey', in: 'cookie', name: SESSION_COOKIE,
          description: 'The browser session. Writes also need the X-XSRF-TOKEN header echoing the XSRF-TOKEN cookie.',
        },
        apiToken: { type: 'http', scheme: 'bearer', description: 'A personal API token (erg_…) from the API tokens page; no CSRF header needed.' },
      },
    },
  };
}
