import { z } from 'zod';
import { authorizedProject, currentUser } from '../auth/authorize.ts';
import type { AppContext } from '../context.ts';
import { changeMemberRole, listMembers, removeMember } from '../services/members.ts';
import { memberRoleBody, memberSchema } from '../../shared/projects.ts';
import { body, idField, params } from './request-parts.ts';
import { noContent, wrapped, type RouteDef } from './route-table.ts';

export function memberRoutes(ctx: AppContext): RouteDef[] {
  return [
    {
      method: 'get', path: '/projects/:id/members', access: { kind: 'project', role: 'viewer', via: 'project' },
      summary: 'Members with their roles.',
      response: wrapped('members', z.array(memberSchema)),
      handler: async (_req, res) => {
        res.json({ members: await listMembers(ctx.db, authorizedProject(res).projectId) });
      },
    },
    {
      method: 'patch', path: '/projects/:id/members/:userId', access: { kind: 'project', role: 'owner', via: 'project' },
      summary: "Changes a member's role and answers the members; the last owner cannot be demoted (409).",
      request: { body: memberRoleBody }, response: wrapped('members', z.array(memberSchema)),
      handler: async (req, res) => {
        const { userId } = params(req, { id: idField, userId: idField });
        const { role } = body(req, memberRoleBody);
        const { projectId } = authorizedProject(res);
        await changeMemberRole(ctx.db, projectId, currentUser(req).id, userId, role);
        res.json({ members: await listMembers(ctx.db, projectId) });
      },
    },
    {
      method: 'delete', path: '/projects/:id/members/:userId', access: { kind: 'project', role: 'owner', via: 'project' },
      summary: 'Removes a member; never the last owner (409).',
      response: noContent,
      handler: async (req, res) => {
        const { userId } = params(req, { id: idField, userId: idField });
        await removeMember(ctx.db, authorizedProject(res).projectId, currentUser(req).id, userId);
        res.status(204).end();
      },
    },
    {
      method: 'delete', path: '/projects/:id/membership', access: { kind: 'project', role: 'viewer', via: 'project' },
      summary: 'Leaves the project yourself; never as its last owner (409).',
      response: noContent,
      handler: async (req, res) => {
        const me = currentUser(req).id;
        await removeMember(ctx.db, authorizedProject(res).projectId, me, me);
        res.status(204).end();
      },
    },
  ];
}
