import { z } from 'zod';
import { currentUser } from '../auth/authorize.ts';
import type { AppContext } from '../context.ts';
import { addComment, listComments } from '../services/comments.ts';
import { COMMENT_MAX_LENGTH } from '../../shared/account-rules.ts';
import { body, idField, params } from './request-parts.ts';
import type { RouteDef } from './route-table.ts';

const commentBody = z.object({
  body: z.string({ error: 'is required' }).trim().min(1, 'must not be empty').max(COMMENT_MAX_LENGTH, `must be at most ${COMMENT_MAX_LENGTH} characters`),
}).strict();

export function commentRoutes(ctx: AppContext): RouteDef[] {
  return [
    {
      method: 'get', path: '/reports/:id/comments', access: { kind: 'project', role: 'viewer', via: 'report' },
      handler: async (req, res) => {
        const { id } = params(req, { id: idField });
        res.json({ comments: await listComments(ctx.db, id) });
      },
    },
    {
      method: 'post', path: '/reports/:id/comments', access: { kind: 'project', role: 'viewer', via: 'report' },
      handler: async (req, res) => {
        const { id } = params(req, { id: idField });
        const comment = await addComment(ctx.db, id, currentUser(req), body(req, commentBody).body);
        res.status(201).json({ comment });
      },
    },
  ];
}
