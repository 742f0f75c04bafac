import type { RequestHandler } from 'express';
import type { AppContext } from '../context.ts';
import { unauthorized } from '../errors.ts';
import { resolveApiToken } from '../services/api-tokens.ts';

/**
 * `Authorization: Bearer erg_…` signs the request in as the token's owner,
 * whatever cookies came with it. A bad token is refused outright rather than
 * falling back to the session, so scripts learn at once that it stopped working.
 */
export function bearerIdentity(ctx: AppContext): RequestHandler {
  return async (req, res, next) => {
    const header = req.get('authorization');
    if (!header) return next();
    const match = /^Bearer\s+(\S+)$/i.exec(header);
    if (!match) throw unauthorized('The Authorization header must be "Bearer <token>".');
    const user = await resolveApiToken(ctx.db, match[1]!);
    if (!user) throw unauthorized('This API token is unknown, revoked, or belongs to a disabled account.');
    req.user = user;
    res.locals['authVia'] = 'bearer';
    next();
  };
}
