import type { RequestHandler } from 'express';
import type { ProjectRole } from '../db/schema/projects.ts';

/** Which resource a route's `:id` (or named param) points at, to find its project. */
export type ResourceKind = 'project' | 'trajectory' | 'report' | 'job' | 'series';

/**
 * Who may call a route. Every route states one; the authorization matrix test
 * walks this table, so a route without a rule cannot be added.
 * - `public`: anyone, signed in or not;
 * - `signed-in`: any active user (session or API token);
 * - `admin`: site admins;
 * - `project`: members of the resource's project with at least `role`
 *   (viewer < editor < owner); site admins get no project rights by role alone.
 * Access-link holders reach reports only through the public /links/:token routes,
 * whose service checks the token.
 */
export type Access =
  | { kind: 'public' }
  | { kind: 'signed-in' }
  | { kind: 'admin' }
  | { kind: 'project'; role: ProjectRole; via: ResourceKind; param?: string };

export type HttpMethod = 'get' | 'post' | 'patch' | 'put' | 'delete';

export interface RouteDef {
  method: HttpMethod;
  /** Path under /api, in Express 5 syntax. */
  path: string;
  access: Access;
  /** Middleware before the handler (e.g. multer for uploads). */
  before?: RequestHandler[];
  handler: RequestHandler;
}
