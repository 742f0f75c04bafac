import type { RequestHandler } from 'express';
import type { z } from 'zod';
import type { ProjectRole } from '../../shared/projects.ts';

/** Which resource a route's `:id` (or named param) points at, to find its project. */
export type ResourceKind = 'project' | 'trajectory' | 'report' | 'job' | 'series';

/**
 * Who may call a route. Every route states one; the authorization matrix test
 * walks this table, so a route without a rule cannot be added.
 * - `public`: anyone, signed in or not;
 * - `signed-in`: any active user (session or API token);
 * - `session`: an active user signed in through the browser, not an API token
 *   (managing tokens: a token must not mint or revoke tokens);
 * - `admin`: site admins;
 * - `project`: members of the resource's project with at least `role`
 *   (viewer < editor < owner); site admins get no project rights by role alone.
 * Access-link holders reach reports only through the public /links/:token routes,
 * whose service checks the token.
 */
export type Access =
  | { kind: 'public' }
  | { kind: 'signed-in' }
  | { kind: 'session' }
  | { kind: 'admin' }
  | { kind: 'project'; role: ProjectRole; via: ResourceKind; param?: string };

export type HttpMethod = 'get' | 'post' | 'patch' | 'put' | 'delete';

/**
 * What a route answers on success. JSON answers wrap their value in one key:
 * a list as `{<plural>: [...]}`, one resource as `{<singular>: {...}}`.
 * Downloads are files (CSV, the report document, frames) and are not wrapped.
 */
export type RouteResponse =
  | { kind: 'json'; status: 200 | 201 | 202; key: string; schema: z.ZodType }
  | { kind: 'empty'; status: 204 }
  | { kind: 'file'; status: 200; contentType: string; schema?: z.ZodType; description: string };

/** What the API document says about a request, from the same schemas the handler parses with. */
export interface RouteRequest {
  body?: z.ZodType;
  query?: z.ZodType;
  /** Multipart upload: the file's field name and the text fields beside it. */
  upload?: { fileField: string; fields: z.ZodType };
}

export interface RouteDef {
  method: HttpMethod;
  /** Path under /api, in Express 5 syntax. */
  path: string;
  access: Access;
  /** One line for the API document (GET /api/openapi.json). */
  summary: string;
  request?: RouteRequest;
  response: RouteResponse;
  /** Middleware before the handler (e.g. multer for uploads). */
  before?: RequestHandler[];
  handler: RequestHandler;
}

/** `{key: value}` answers, the one JSON style of every route. */
export function wrapped(key: string, schema: z.ZodType, status: 200 | 201 | 202 = 200): RouteResponse {
  return { kind: 'json', status, key, schema };
}

export const noContent: RouteResponse = { kind: 'empty', status: 204 };

export function download(contentType: string, description: string, schema?: z.ZodType): RouteResponse {
  return { kind: 'file', status: 200, contentType, description, schema };
}
