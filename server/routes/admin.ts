import { z } from 'zod';
import { currentUser } from '../auth/authorize.ts';
import type { AppContext } from '../context.ts';
import { listUsers, updateUser } from '../services/admin-users.ts';
import { listDevMail } from '../services/dev-mail.ts';
import { adminUserChangesBody, adminUserSchema, sentMailSchema } from '../../shared/admin.ts';
import { body, idField, params } from './request-parts.ts';
import { wrapped, type RouteDef } from './route-table.ts';

export function adminRoutes(ctx: AppContext): RouteDef[] {
  return [
    {
      method: 'get', path: '/admin/users', access: { kind: 'admin' },
      summary: 'Every account.',
      response: wrapped('users', z.array(adminUserSchema)),
      handler: async (_req, res) => {
        res.json({ users: await listUsers(ctx.db) });
      },
    },
    {
      method: 'patch', path: '/admin/users/:userId', access: { kind: 'admin' },
      summary: 'Makes or unmakes an admin, disables or enables an account; one active admin always remains (409).',
      request: { body: adminUserChangesBody }, response: wrapped('user', adminUserSchema),
      handler: async (req, res) => {
        const { userId } = params(req, { userId: idField });
        const changes = body(req, adminUserChangesBody);
        res.json({ user: await updateUser(ctx.db, currentUser(req).id, userId, changes) });
      },
    },
    {
      method: 'get', path: '/admin/mail', access: { kind: 'admin' },
      summary: 'Messages kept by the SMTP fake (only when MAIL_FAKE_DIR is set, else 404).',
      response: wrapped('messages', z.array(sentMailSchema)),
      handler: async (_req, res) => {
        res.json({ messages: await listDevMail(ctx.config.MAIL_FAKE_DIR) });
      },
    },
  ];
}
