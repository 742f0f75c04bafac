import { z } from 'zod';
import { currentUser } from '../auth/authorize.ts';
import { issueXsrfCookie } from '../auth/csrf.ts';
import { endSession, signInWithPassword, startSession } from '../auth/passport.ts';
import { cookiesAreSecure, SESSION_COOKIE } from '../auth/session.ts';
import type { AppContext } from '../context.ts';
import { registerUser } from '../services/accounts.ts';
import { confirmPasswordReset, requestPasswordReset } from '../services/password-reset.ts';
import { appOrigin, body, displayNameField, emailField, passwordField, tokenField } from './request-parts.ts';
import type { RouteDef } from './route-table.ts';

const registerBody = z.object({ email: emailField, password: passwordField, displayName: displayNameField }).strict();
const loginBody = z.object({ email: emailField, password: z.string({ error: 'is required' }).min(1, 'is required').max(1000) }).strict();
const resetRequestBody = z.object({ email: emailField }).strict();
const resetConfirmBody = z.object({ token: tokenField, password: passwordField }).strict();

export function authRoutes(ctx: AppContext): RouteDef[] {
  const secure = cookiesAreSecure(ctx);
  return [
    {
      method: 'post', path: '/auth/register', access: { kind: 'public' },
      handler: async (req, res) => {
        const user = await registerUser(ctx.db, body(req, registerBody));
        await startSession(req, user);
        issueXsrfCookie(res, secure);
        res.status(201).json({ user });
      },
    },
    {
      method: 'post', path: '/auth/login', access: { kind: 'public' },
      handler: async (req, res) => {
        body(req, loginBody);
        const user = await signInWithPassword(ctx, req, res);
        // A new session gets a new CSRF token too, so one seen before sign-in is worth nothing after.
        issueXsrfCookie(res, secure);
        res.json({ user });
      },
    },
    {
      method: 'post', path: '/auth/logout', access: { kind: 'public' },
      handler: async (req, res) => {
        await endSession(req);
        res.clearCookie(SESSION_COOKIE, { httpOnly: true, sameSite: 'lax', secure });
        res.status(204).end();
      },
    },
    {
      method: 'get', path: '/auth/me', access: { kind: 'signed-in' },
      handler: (req, res) => {
        res.json({ user: currentUser(req) });
      },
    },
    {
      method: 'post', path: '/auth/password-reset', access: { kind: 'public' },
      handler: (req, res) => {
        const { email } = body(req, resetRequestBody);
        // Sent in the background so the answer takes as long whether or not the account exists.
        requestPasswordReset(ctx, email, appOrigin(ctx, req))
          .catch((err: unknown) => ctx.log.error({ err }, 'password reset e-mail failed'));
        res.status(202).json({ message: 'If an account uses this e-mail, a reset link is on its way.' });
      },
    },
    {
      method: 'post', path: '/auth/password-reset/confirm', access: { kind: 'public' },
      handler: async (req, res) => {
        const { token, password } = body(req, resetConfirmBody);
        const user = await confirmPasswordReset(ctx, token, password);
        await startSession(req, user);
        issueXsrfCookie(res, secure);
        res.json({ user });
      },
    },
  ];
}
