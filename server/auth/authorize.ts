import type {} from 'passport';
import type { Request, RequestHandler, Response } from 'express';
import type { AppContext } from '../context.ts';
import type { ProjectRole, TrajectoryRow } from '../db/schema/index.ts';
import { forbidden, notFound, unauthorized } from '../errors.ts';
import type { Access } from '../routes/route-table.ts';
import { membershipVia } from './project-of.ts';

const RANK: Record<ProjectRole, number> = { viewer: 1, editor: 2, owner: 3 };

/** The signed-in user, set by the identity middleware from a session or a bearer token. */
export interface CurrentUser {
  id: number;
  email: string;
  displayName: string;
  role: 'admin' | 'member';
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // passport declares `User`; ours carries these fields.
    interface User extends CurrentUser {}
  }
}

/** What a route handler may rely on after authorization. */
export interface AuthorizedLocals {
  projectId?: number;
  projectRole?: ProjectRole;
}

function idParam(value: unknown): number | null {
  const n = Number(value);
  return Number.isSafeInteger(n) && n > 0 && String(n) === String(value) ? n : null;
}

/**
 * Enforces a route's Access rule. Resources the caller may not see answer 404
 * rather than 403, so ids do not reveal what exists in other projects.
 */
export function authorize(ctx: AppContext, access: Access): RequestHandler {
  return async (req, res, next) => {
    if (access.kind === 'public') return next();
    const user = req.user;
    if (!user) throw unauthorized();
    if (access.kind === 'signed-in') return next();
    if (access.kind === 'session') {
      if (res.locals['authVia'] === 'bearer') {
        throw forbidden('This can be done only from a signed-in browser session, not with an API token.');
      }
      return next();
    }
    if (access.kind === 'admin') {
      if (user.role !== 'admin') throw forbidden('Only a site admin can do this.');
      return next();
    }
    const raw = req.params[access.param ?? 'id'];
    const id = idParam(raw);
    const what = access.via[0]!.toUpperCase() + access.via.slice(1);
    if (id === null) throw notFound(what);
    const membership = await membershipVia(ctx.db, access.via, id, user.id);
    if (!membership) throw notFound(what);
    if (RANK[membership.role] < RANK[access.role]) {
      throw forbidden(`This needs the ${access.role} role in the project; you are ${membership.role === 'editor' ? 'an' : 'a'} ${membership.role}.`);
    }
    res.locals['projectId'] = membership.projectId;
    res.locals['projectRole'] = membership.role;
    if (membership.trajectory) res.locals['trajectory'] = membership.trajectory;
    next();
  };
}

/** The caller of a route whose rule requires sign-in; authorize() has already refused anyone else. */
export function currentUser(req: Request): CurrentUser {
  if (!req.user) throw unauthorized();
  return req.user;
}

/** The project and role authorize() found for a project route. */
export function authorizedProject(res: Response): { projectId: number; role: ProjectRole } {
  const projectId: unknown = res.locals['projectId'];
  const role: unknown = res.locals['projectRole'];
  if (typeof projectId !== 'number' || typeof role !== 'string' || !(role in RANK)) {
    throw new Error('authorizedProject() used on a route without a project access rule');
  }
  return { projectId, role: role as ProjectRole };
}

/** The trajectory a route reached via one was authorized for, read in the same query as the caller's role. */
export function authorizedTrajectory(res: Response): TrajectoryRow {
  const row: unknown = res.locals['trajectory'];
  if (!row || typeof row !== 'object') throw new Error('authorizedTrajectory() used on a route without a trajectory access rule');
  return row as TrajectoryRow;
}
