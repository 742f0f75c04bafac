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
      summary: 'Your API tokens (name, prefix, created, last used; never the secret).',
      response: wrapped('tokens', z.array(apiTokenSchema)),
      handler: async (req, res) => {
        res.json({ tokens: await listApiTokens(ctx.db, currentUser(req).id) });
      },
    },
    {
      method: 'post', path: '/tokens', access: { kind: 'signed-in' },
      summary: 'A new token; its secret is shown this once.',
      request: { body: createTokenBody }, response: wrapped('token', newApiTokenSchema, 201),
      handler: async (req, res) => {
        const { name } = body(req, createTokenBody);
        res.status(201).json({ token: await createApiToken(ctx.db, currentUser(req).id, name) });
      },
    },
    {
      method: 'delete', path: '/tokens/:tokenId', access: { kind: 'signed-in' },
      summary: 'Revokes one of your tokens.',
      response: noContent,
      handler: async (req, res) => {
        const { tokenId } = params(req, { tokenId: idField });
        await revokeApiToken(ctx.db, currentUser(req).id, tokenId);
        res.status(204).end();
      },
    },
  ];
}
