import { randomBytes, timingSafeEqual } from 'node:crypto';
import type { RequestHandler, Response } from 'express';
import { AppError } from '../errors.ts';

export const XSRF_COOKIE = 'XSRF-TOKEN';
export const XSRF_HEADER = 'x-xsrf-token';
const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);
const TOKEN_SHAPE = /^[A-Za-z0-9_-]{43}$/;

/** Readable by the page's script on purpose: the app echoes it in the X-XSRF-TOKEN header. */
export function issueXsrfCookie(res: Response, secure: boolean): string {
  const token = randomBytes(32).toString('base64url');
  res.cookie(XSRF_COOKIE, token, { httpOnly: false, sameSite: 'lax', secure, path: '/' });
  return token;
}

function sameToken(a: string, b: string): boolean {
  const left = Buffer.from(a);
  const right = Buffer.from(b);
  return left.length === right.length && timingSafeEqual(left, right);
}

/**
 * Double-submit CSRF check for requests that could ride on the session
 * cookie. Another site can make the browser send our cookies but cannot read
 * them, so it cannot copy the token into the header. Bearer requests carry
 * no ambient credentials and skip the check.
 */
export function csrfProtection(secure: boolean): RequestHandler {
  return (req, res, next) => {
    if (res.locals['authVia'] === 'bearer') return next();
    const cookieValue: unknown = req.cookies?.[XSRF_COOKIE];
    const cookieToken = typeof cookieValue === 'string' && TOKEN_SHAPE.test(cookieValue) ? cookieValue : issueXsrfCookie(res, secure);
    if (SAFE_METHODS.has(req.method)) return next();
    const header = req.get(XSRF_HEADER);
    if (!header || !sameToken(header, cookieToken)) {
      throw new AppError(403, 'csrf_rejected',
        'This request lacks a valid X-XSRF-TOKEN header: send the value of the XSRF-TOKEN cookie in it, or use an API token (Authorization: Bearer).');
    }
    next();
  };
}
