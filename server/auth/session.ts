import session from 'express-session';
import createMySQLStore from 'express-mysql-session';
import type { RequestHandler } from 'express';
import type { AppContext } from '../context.ts';

export const SESSION_COOKIE = 'ergodic.sid';
const SESSION_DAYS = 14;
const DAY_MS = 86_400_000;

/** Whether cookies must carry the Secure flag: only when users reach the app over https. */
export const cookiesAreSecure = (ctx: AppContext) => ctx.config.PUBLIC_URL?.startsWith('https://') ?? false;

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
