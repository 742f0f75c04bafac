import cookieParser from 'cookie-parser';
import type { RequestHandler } from 'express';
import type { AppContext } from '../context.ts';
import { bearerIdentity } from './bearer.ts';
import { csrfProtection } from './csrf.ts';
import { passportFor } from './passport.ts';
import { cookiesAreSecure, sessionMiddleware } from './session.ts';

/**
 * Who is calling, in order: cookies, the session, passport's user from the
 * session, a bearer token (which wins), then the CSRF check that needs to know
 * whether the request came with a bearer token.
 */
export function identityMiddleware(ctx: AppContext): RequestHandler[] {
  const authenticator = passportFor(ctx);
  return [
    cookieParser(),
    sessionMiddleware(ctx),
    authenticator.initialize(),
    authenticator.session(),
    bearerIdentity(ctx),
    csrfProtection(ctx.config.SESSION_SECRET, cookiesAreSecure(ctx)),
  ];
}
