import { createHmac, randomBytes, timingSafeEqual } from 'node:crypto';
import type { Request, RequestHandler, Response } from 'express';
import { AppError } from '../errors.ts';

export const XSRF_COOKIE = 'XSRF-TOKEN';
export const XSRF_HEADER = 'x-xsrf-token';
const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);
const TOKEN_SHAPE = /^[A-Za-z0-9_-]{43}$/;

/** Whether this request rides on a signed-in session (passport keeps the user id in it). */
function signedInSession(req: Request): boolean {
  const data = req.session as unknown as { passport?: { user?: unknown } } | undefined;
  return data?.passport?.user !== undefined && Boolean(req.sessionID);
}

/**
 * The token of a signed-in session is derived from its id with the session
 * secret (HMAC-SHA-256), so it is bound to that session: a token planted by
 * someone who can write our cookies (a sibling subdomain, say) or one seen
 * under another session is worth nothing. Before sign-in a random token is
 * used, and sign-in replaces it.
 */
function tokenFor(req: Request, secret: string): string | null {
  if (!signedInSession(req)) return null;
  return createHmac('sha256', secret).update(`xsrf:${req.sessionID}`).digest('base64url');
}

/** Readable by the page's script on purpose: the app echoes it in the X-XSRF-TOKEN header. */
export function issueXsrfCookie(req: Request, res: Response, secret: string, secure: boolean): string {
  const token = tokenFor(req, secret) ?? randomBytes(32).toString('base64url');
  res.cookie(XSRF_COOKIE, token, { httpOnly: false, sameSite: 'lax', secure, path: '/' });
  return token;
}

function sameToken(a: string, b: string): boolean {
  const left = Buffer.from(a);
  const right = Buffer.from(b);
  return left.length === right.length && timingSafeEqual(left, right);
}

/**
 * CSRF check for requests that could ride on the session cookie: the
 * X-XSRF-TOKEN header must carry the session's own token (signed in) or
 * echo the XSRF cookie (not signed in, which still stops login CSRF).
 * Another site can make the browser send our cookies but cannot read them.
 * Bearer requests carry no ambient credentials and skip the check.
 */
export function csrfProtection(secret: string, secure: boolean): RequestHandler {
  return (req, res, next) => {
    if (res.locals['authVia'] === 'bearer') return next();
    const bound = tokenFor(req, secret);
    const cookieValue: unknown = req.cookies?.[XSRF_COOKIE];
    const cookieToken = typeof cookieValue === 'string' && TOKEN_SHAPE.test(cookieValue) ? cookieValue : null;
    // The page's copy is refreshed whenever it is missing or not this session's.
    const expected = bound ?? cookieToken ?? issueXsrfCookie(req, res, secret, secure);
    if (bound && cookieToken !== bound) issueXsrfCookie(req, res, secret, secure);
    if (SAFE_METHODS.has(req.method)) return next();
    const header = req.get(XSRF_HEADER);
    if (!header || !sameToken(header, expected)) {
      throw new AppError(403, 'csrf_rejected',
        'This request lacks a valid X-XSRF-TOKEN header: send the value of the XSRF-TOKEN cookie in it, or use an API token (Authorization: Bearer).');
    }
    next();
  };
}
