import session from 'express-session';
import createMySQLStore from 'express-mysql-session';
import type { RequestHandler } from 'express';
import type { AppContext } from '../context.ts';

export const SESSION_COOKIE = 'ergodic.sid';
const SESSION_DAYS = 14;
const DAY_MS = 86_400_000;

/** Whether cookies must carry the Secure flag: only when users reach the app over https. */
export const cookiesAreSecure = (ctx: AppContext) => ctx.config.PUBLIC_URL?.startsWith('https://') ?? false;

/** How far a session's stored expiry may lag behind its cookie's (out of SESSION_DAYS). */
export const SESSION_TOUCH_EVERY_MS = 10 * 60_000;
/** Sessions whose last touch this process remembers; a forgotten one is simply touched again. */
const REMEMBERED_TOUCHES = 10_000;

/**
 * With rolling sessions, express-session writes each session's new expiry
 * to the store at the end of every response that did not change it, and
 * holds the response's last byte until that write is done: a database
 * write per GET, on the path of every frame the viewer fetches. Writing it
 * at most every SESSION_TOUCH_EVERY_MS per session (per process) lets a
 * 14-day session end at most that much early. Reading the session, and so
 * sign-out and revocation, is untouched: that still happens on every request.
 */
export function throttleTouches(store: session.Store, now: () => number = Date.now): void {
  const touch = store.touch?.bind(store);
  if (!touch) return;
  const touchedAt = new Map<string, number>();
  store.touch = (sid, data, callback) => {
    const at = now();
    const last = touchedAt.get(sid);
    if (last !== undefined && at - last < SESSION_TOUCH_EVERY_MS) {
      callback?.();
      return;
    }
    touchedAt.delete(sid);
    touchedAt.set(sid, at);
    if (touchedAt.size > REMEMBERED_TOUCHES) touchedAt.delete(touchedAt.keys().next().value!);
    touch(sid, data, (err?: unknown) => {
      // A failed write is tried again on the next request.
      if (err && touchedAt.get(sid) === at) touchedAt.delete(sid);
      // express-session's callback takes the error, though the type declares none.
      (callback as ((e?: unknown) => void) | undefined)?.(err);
    });
  };
}

/**
 * Sessions live in MariaDB so any web node can serve any request. The store
 * shares the app's pool; its own expiry sweep is replaced by an unref'd timer
 * so a stopped app does not keep the process alive.
 */
export function sessionMiddleware(ctx: AppContext): RequestHandler {
  const MySQLStore = createMySQLStore(session);
  const store = new MySQLStore({
    createDatabaseTable: true,
    clearExpired: false,
    expiration: SESSION_DAYS * DAY_MS,
    endConnectionOnClose: false,
  }, ctx.pool);
  throttleTouches(store);
  setInterval(() => {
    store.clearExpiredSessions().catch((err: unknown) => ctx.log.warn({ err }, 'could not clear expired sessions'));
  }, 15 * 60_000).unref();
  return session({
    name: SESSION_COOKIE,
    secret: ctx.config.SESSION_SECRET,
    store,
    resave: false,
    saveUninitialized: false,
    rolling: true,
    proxy: ctx.config.TRUST_PROXY,
    cookie: { httpOnly: true, sameSite: 'lax', secure: cookiesAreSecure(ctx), maxAge: SESSION_DAYS * DAY_MS },
  });
}
