import { z } from 'zod';
import { currentUser } from '../auth/authorize.ts';
import type { AppContext } from '../context.ts';
import { createApiToken, listApiTokens, revokeApiToken } from '../services/api-tokens.ts';
import { body, idField, params } from './request-parts.ts';
import type { RouteDef } from './route-table.ts';

const createBody = z.object({
  name: z.string({ error: 'is required' }).trim().min(1, 'must not be empty').max(120, 'must be at most 120 characters'),
}).strict();

/** Personal API tokens: each user manages only their own. */
export function tokenRoutes(ctx: AppContext): RouteDef[] {
  return [
    {
      method: 'get', path: '/tokens', access: { kind: 'signed-in' },
      handler: async (req, res) => {
        res.json({ tokens: await listApiTokens(ctx.db, currentUser(req).id) });
      },
    },
    {
      method: 'post', path: '/tokens', access: { kind: 'signed-in' },
      handler: async (req, res) => {
        const { name } = body(req, createBody);
        res.status(201).json({ token: await createApiToken(ctx.db, currentUser(req).id, name) });
      },
    },
    {
      method: 'delete', path: '/tokens/:tokenId', access: { kind: 'signed-in' },
      handler: async (req, res) => {
        const { tokenId } = params(req, { tokenId: idField });
        await revokeApiToken(ctx.db, currentUser(req).id, tokenId);
        res.status(204).end();
      },
    },
  ];
}
