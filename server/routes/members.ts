import { z } from 'zod';
import { authorizedProject, currentUser } from '../auth/authorize.ts';
import type { AppContext } from '../context.ts';
import { changeMemberRole, listMembers, removeMember } from '../services/members.ts';
import { body, idField, params, roleField } from './request-parts.ts';
import type { RouteDef } from './route-table.ts';

const roleBody = z.object({ role: roleField }).strict();

export function memberRoutes(ctx: AppContext): RouteDef[] {
  return [
    {
      method: 'get', path: '/projects/:id/members', access: { kind: 'project', role: 'viewer', via: 'project' },
      handler: async (_req, res) => {
        res.json({ members: await listMembers(ctx.db, authorizedProject(res).projectId) });
      },
    },
    {
      method: 'patch', path: '/projects/:id/members/:userId', access: { kind: 'project', role: 'owner', via: 'project' },
      handler: async (req, res) => {
        const { userId } = params(req, { id: idField, userId: idField });
        const { role } = body(req, roleBody);
        const { projectId } = authorizedProject(res);
        await changeMemberRole(ctx.db, projectId, currentUser(req).id, userId, role);
        res.json({ members: await listMembers(ctx.db, projectId) });
      },
    },
    {
      method: 'delete', path: '/projects/:id/members/:userId', access: { kind: 'project', role: 'owner', via: 'project' },
      handler: async (req, res) => {
        const { userId } = params(req, { id: idField, userId: idField });
        await removeMember(ctx.db, authorizedProject(res).projectId, currentUser(req).id, userId);
        res.status(204).end();
      },
    },
    {
      method: 'delete', path: '/projects/:id/membership', access: { kind: 'project', role: 'viewer', via: 'project' },
      handler: async (req, res) => {
        const me = currentUser(req).id;
        await removeMember(ctx.db, authorizedProject(res).projectId, me, me);
        res.status(204).end();
      },
    },
  ];
}
