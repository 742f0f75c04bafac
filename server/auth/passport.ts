import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import type { Request, Response } from 'express';
import type { AppContext } from '../context.ts';
import { unauthorized } from '../errors.ts';
import { checkCredentials } from '../services/sign-in.ts';
import type { CurrentUser } from './authorize.ts';
import { loadActiveUser } from './current-user.ts';

type Authenticator = InstanceType<typeof passport.Passport>;

/** One authenticator per app context, so test apps never share strategies or serializers. */
const authenticators = new WeakMap<AppContext, Authenticator>();

export function passportFor(ctx: AppContext): Authenticator {
  let instance = authenticators.get(ctx);
  if (instance) return instance;
  instance = new passport.Passport();
  instance.use('local', new LocalStrategy({ usernameField: 'email', passwordField: 'password', passReqToCallback: true },
    (req, email, password, done) => {
      checkCredentials(ctx, { email, password, ip: req.ip ?? 'unknown' }).then((user) => done(null, user), done);
    }));
  instance.serializeUser((user, done) => done(null, user.id));
  // Re-read on every request: a disabled account loses its sessions at once.
  instance.deserializeUser((id: unknown, done) => {
    if (typeof id !== 'number') return done(null, false);
    loadActiveUser(ctx.db, id).then((user) => done(null, user ?? false), done);
  });
  authenticators.set(ctx, instance);
  return instance;
}

/** Checks e-mail and password with the local strategy, then starts a fresh session (new id). */
export function signInWithPassword(ctx: AppContext, req: Request, res: Response): Promise<CurrentUser> {
  const authenticator = passportFor(ctx);
  return new Promise((resolve, reject) => {
    authenticator.authenticate('local', { session: false }, (err: unknown, user: CurrentUser | false) => {
      if (err) return reject(err);
      if (!user) return reject(unauthorized('Wrong e-mail or password.'));
      req.logIn(user, (loginErr) => (loginErr ? reject(loginErr) : resolve(user)));
    })(req, res, reject);
  });
}

/** Starts a session for a user who just proved who they are some other way (sign-up, password reset). */
export function startSession(req: Request, user: CurrentUser): Promise<void> {
  return new Promise((resolve, reject) => req.logIn(user, (err) => (err ? reject(err) : resolve())));
}

export function endSession(req: Request): Promise<void> {
  return new Promise((resolve, reject) => {
    req.logout((err) => {
      if (err) return reject(err);
      req.session.destroy((destroyErr) => (destroyErr ? reject(destroyErr) : resolve()));
    });
  });
}
