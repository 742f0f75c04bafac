import { z } from 'zod';
import { currentUser } from '../auth/authorize.ts';
import { apiRateLimits } from '../auth/rate-limits.ts';
import type { AppContext } from '../context.ts';
import { addComment, listComments } from '../services/comments.ts';
import { commentBody, commentSchema } from '../../shared/sharing.ts';
import { body, idField, params } from './request-parts.ts';
import { wrapped, type RouteDef } from './route-table.ts';

export function commentRoutes(ctx: AppContext): RouteDef[] {
  const limits = apiRateLimits(ctx);
  return [
    {
      method: 'get', path: '/reports/:id/comments', access: { kind: 'project', role: 'viewer', via: 'report' },
      summary: 'Comments on a report, oldest first.',
      response: wrapped('comments', z.array(commentSchema)),
      handler: async (req, res) => {
        const { id } = params(req, { id: idField });
        res.json({ comments: await listComments(ctx.db, id) });
      },
    },
    {
      method: 'post', path: '/reports/:id/comments', access: { kind: 'project', role: 'viewer', via: 'report' },
      summary: 'Adds a comment.',
      request: { body: commentBody }, response: wrapped('comment', commentSchema, 201),
      before: [limits.comments],
      handler: async (req, res) => {
        const { id } = params(req, { id: idField });
        const comment = await addComment(ctx.db, id, currentUser(req), body(req, commentBody).body);
        res.status(201).json({ comment });
      },
    },
  ];
}
