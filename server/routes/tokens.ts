import { z } from 'zod';
import { currentUser } from '../auth/authorize.ts';
import type { AppContext } from '../context.ts';
import { createApiToken, listApiTokens, revokeApiToken } from '../services/api-tokens.ts';
import { apiTokenSchema, createTokenBody, newApiTokenSchema } from '../../shared/accounts.ts';
import { body, idField, params } from './request-parts.ts';
import { noContent, wrapped, type RouteDef } from './route-table.ts';

/** Personal API tokens: each user manages only their own. */
export function tokenRoutes(ctx: AppContext): RouteDef[] {
  return [
    {
      method: 'get', path: '/tokens', access: { kind: 'signed-in' },
      summary: 'Your API tokens (name, prefix, created, last used, expiry; never the secret), and those stopped in the last 30 days with the reason.',
      response: wrapped('tokens', z.array(apiTokenSchema)),
      handler: async (req, res) => {
        res.json({ tokens: await listApiTokens(ctx.db, currentUser(req).id) });
      },
    },
    {
      // Only from a session: whoever holds a token could otherwise mint more and keep access after it is revoked.
      method: 'post', path: '/tokens', access: { kind: 'session' },
      summary: 'A new token, optionally expiring after `expiresInDays`; its secret is shown this once. Only from a signed-in session.',
      request: { body: createTokenBody }, response: wrapped('token', newApiTokenSchema, 201),
      handler: async (req, res) => {
        const { name, expiresInDays } = body(req, createTokenBody);
        const expiresAt = expiresInDays ? new Date(Date.now() + expiresInDays * 86_400_000) : null;
        res.status(201).json({ token: await createApiToken(ctx.db, currentUser(req).id, name, expiresAt) });
      },
    },
    {
      method: 'delete', path: '/tokens/:tokenId', access: { kind: 'session' },
      summary: 'Revokes one of your tokens. Only from a signed-in session.',
      response: noContent,
      handler: async (req, res) => {
        const { tokenId } = params(req, { tokenId: idField });
        await revokeApiToken(ctx.db, currentUser(req).id, tokenId);
        res.status(204).end();
      },
    },
  ];
}
