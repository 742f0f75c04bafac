import { z } from 'zod';
import { authorizedProject, currentUser } from '../auth/authorize.ts';
import type { AppContext } from '../context.ts';
import { acceptInvitation, createInvitation, describeInvitation, listPendingInvitations, revokeInvitation } from '../services/invitations.ts';
import { appOrigin, body, emailField, idField, params, roleField, tokenField } from './request-parts.ts';
import type { RouteDef } from './route-table.ts';

const inviteBody = z.object({ email: emailField, role: roleField }).strict();

export function invitationRoutes(ctx: AppContext): RouteDef[] {
  return [
    {
      method: 'get', path: '/projects/:id/invitations', access: { kind: 'project', role: 'owner', via: 'project' },
      handler: async (_req, res) => {
        res.json({ invitations: await listPendingInvitations(ctx.db, authorizedProject(res).projectId) });
      },
    },
    {
      method: 'post', path: '/projects/:id/invitations', access: { kind: 'project', role: 'owner', via: 'project' },
      handler: async (req, res) => {
        const { email, role } = body(req, inviteBody);
        const invitation = await createInvitation(ctx, {
          projectId: authorizedProject(res).projectId, actor: currentUser(req), email, role, origin: appOrigin(ctx, req),
        });
        res.status(201).json({ invitation });
      },
    },
    {
      method: 'delete', path: '/projects/:id/invitations/:invitationId', access: { kind: 'project', role: 'owner', via: 'project' },
      handler: async (req, res) => {
        const { invitationId } = params(req, { id: idField, invitationId: idField });
        await revokeInvitation(ctx.db, authorizedProject(res).projectId, currentUser(req).id, invitationId);
        res.status(204).end();
      },
    },
    {
      method: 'get', path: '/invitations/:invitationToken', access: { kind: 'public' },
      handler: async (req, res) => {
        const { invitationToken } = params(req, { invitationToken: tokenField });
        res.json({ invitation: await describeInvitation(ctx.db, invitationToken) });
      },
    },
    {
      method: 'post', path: '/invitations/:invitationToken/accept', access: { kind: 'signed-in' },
      handler: async (req, res) => {
        const { invitationToken } = params(req, { invitationToken: tokenField });
        res.json(await acceptInvitation(ctx.db, invitationToken, currentUser(req)));
      },
    },
  ];
}
