import { z } from 'zod';
import { currentUser } from '../auth/authorize.ts';
import type { AppContext } from '../context.ts';
import { listUsers, updateUser } from '../services/admin-users.ts';
import { listDevMail } from '../services/dev-mail.ts';
import { body, idField, params } from './request-parts.ts';
import type { RouteDef } from './route-table.ts';

const userChanges = z.object({
  role: z.enum(['admin', 'member'], { error: 'must be admin or member' }).optional(),
  disabled: z.boolean({ error: 'must be true or false' }).optional(),
}).strict().refine((c) => c.role !== undefined || c.disabled !== undefined, 'send role, disabled or both');

export function adminRoutes(ctx: AppContext): RouteDef[] {
  return [
    {
      method: 'get', path: '/admin/users', access: { kind: 'admin' },
      handler: async (_req, res) => {
        res.json({ users: await listUsers(ctx.db) });
      },
    },
    {
      method: 'patch', path: '/admin/users/:userId', access: { kind: 'admin' },
      handler: async (req, res) => {
        const { userId } = params(req, { userId: idField });
        const changes = body(req, userChanges);
        res.json({ user: await updateUser(ctx.db, ctx.pool, currentUser(req).id, userId, changes) });
      },
    },
    {
      method: 'get', path: '/admin/mail', access: { kind: 'admin' },
      handler: async (_req, res) => {
        res.json({ messages: await listDevMail(ctx.config.MAIL_FAKE_DIR) });
      },
    },
  ];
}
