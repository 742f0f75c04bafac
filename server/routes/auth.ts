import { currentUser } from '../auth/authorize.ts';
import { issueXsrfCookie } from '../auth/csrf.ts';
import { endSession, signInWithPassword, startSession } from '../auth/passport.ts';
import { cookiesAreSecure, SESSION_COOKIE } from '../auth/session.ts';
import { apiRateLimits } from '../auth/rate-limits.ts';
import type { AppContext } from '../context.ts';
import { registerUser } from '../services/accounts.ts';
import { confirmPasswordReset, requestPasswordReset } from '../services/password-reset.ts';
import {
  noticeSchema, passwordResetBody, passwordResetConfirmBody, registerBody, signedInUserSchema, signInBody,
} from '../../shared/accounts.ts';
import { appOrigin, body } from './request-parts.ts';
import { noContent, wrapped, type RouteDef } from './route-table.ts';

export function authRoutes(ctx: AppContext): RouteDef[] {
  const limits = apiRateLimits(ctx);
  const secure = cookiesAreSecure(ctx);
  return [
    {
      method: 'post', path: '/auth/register', access: { kind: 'public' },
      summary: 'Creates an account (the first account of an instance is its admin) and signs in.',
      request: { body: registerBody }, response: wrapped('user', signedInUserSchema, 201),
      before: [limits.registration],
      handler: async (req, res) => {
        const user = await registerUser(ctx.db, body(req, registerBody));
        await startSession(req, user);
        issueXsrfCookie(req, res, ctx.config.SESSION_SECRET, secure);
        res.status(201).json({ user });
      },
    },
    {
      method: 'post', path: '/auth/login', access: { kind: 'public' },
      summary: 'Signs in with e-mail and password (a new session id).',
      request: { body: signInBody }, response: wrapped('user', signedInUserSchema),
      handler: async (req, res) => {
        body(req, signInBody);
        const user = await signInWithPassword(ctx, req, res);
        // A new session gets a new CSRF token too, so one seen before sign-in is worth nothing after.
        issueXsrfCookie(req, res, ctx.config.SESSION_SECRET, secure);
        res.json({ user });
      },
    },
    {
      method: 'post', path: '/auth/logout', access: { kind: 'public' },
      summary: 'Ends the session.',
      response: noContent,
      handler: async (req, res) => {
        await endSession(req);
        res.clearCookie(SESSION_COOKIE, { httpOnly: true, sameSite: 'lax', secure });
        res.status(204).end();
      },
    },
    {
      method: 'get', path: '/auth/session', access: { kind: 'public' },
      summary: 'Who this request is signed in as, or null: the browser app asks this at start-up, so a signed-out visitor gets no 401.',
      response: wrapped('user', signedInUserSchema.nullable()),
      handler: (req, res) => {
        res.json({ user: req.user ?? null });
      },
    },
    {
      method: 'get', path: '/auth/me', access: { kind: 'signed-in' },
      summary: 'The signed-in user.',
      response: wrapped('user', signedInUserSchema),
      handler: (req, res) => {
        res.json({ user: currentUser(req) });
      },
    },
    {
      method: 'post', path: '/auth/password-reset', access: { kind: 'public' },
      summary: 'Mails a single-use reset link valid 60 minutes; answers 202 whether or not the account exists.',
      request: { body: passwordResetBody }, response: wrapped('message', noticeSchema, 202),
      before: [limits.passwordReset],
      handler: (req, res) => {
        const { email } = body(req, passwordResetBody);
        // Sent in the background so the answer takes as long whether or not the account exists.
        requestPasswordReset(ctx, email, appOrigin(ctx))
          .catch((err: unknown) => ctx.log.error({ err }, 'password reset e-mail failed'));
        res.status(202).json({ message: 'If an account uses this e-mail, a reset link is on its way.' });
      },
    },
    {
      method: 'post', path: '/auth/password-reset/confirm', access: { kind: 'public' },
      summary: "Sets a new password with a reset token, ends the account's other sessions and signs in.",
      request: { body: passwordResetConfirmBody }, response: wrapped('user', signedInUserSchema),
      before: [limits.passwordResetConfirm],
      handler: async (req, res) => {
        const { token, password } = body(req, passwordResetConfirmBody);
        const user = await confirmPasswordReset(ctx, token, password);
        await startSession(req, user);
        issueXsrfCookie(req, res, ctx.config.SESSION_SECRET, secure);
        res.json({ user });
      },
    },
  ];
}
