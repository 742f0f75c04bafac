import { z } from 'zod';
import { authorizedProject, currentUser } from '../auth/authorize.ts';
import { apiRateLimits } from '../auth/rate-limits.ts';
import type { AppContext } from '../context.ts';
import { getProject } from '../services/projects.ts';
import { acceptInvitation, createInvitation, describeInvitation, listPendingInvitations, revokeInvitation } from '../services/invitations.ts';
import { secretTokenField } from '../../shared/accounts.ts';
import { invitationFactsSchema, inviteBody, pendingInvitationSchema, projectSchema } from '../../shared/projects.ts';
import { appOrigin, body, idField, params } from './request-parts.ts';
import { noContent, wrapped, type RouteDef } from './route-table.ts';

export function invitationRoutes(ctx: AppContext): RouteDef[] {
  const limits = apiRateLimits(ctx);
  return [
    {
      method: 'get', path: '/projects/:id/invitations', access: { kind: 'project', role: 'owner', via: 'project' },
      summary: 'Pending invitations.',
      response: wrapped('invitations', z.array(pendingInvitationSchema)),
      handler: async (_req, res) => {
        res.json({ invitations: await listPendingInvitations(ctx.db, authorizedProject(res).projectId) });
      },
    },
    {
      method: 'post', path: '/projects/:id/invitations', access: { kind: 'project', role: 'owner', via: 'project' },
      summary: 'Mails a single-use invitation link valid 7 days.',
      request: { body: inviteBody }, response: wrapped('invitation', pendingInvitationSchema, 201),
      before: [limits.invitationsToOneAddress, limits.invitations],
      handler: async (req, res) => {
        const { email, role } = body(req, inviteBody);
        const invitation = await createInvitation(ctx, {
          projectId: authorizedProject(res).projectId, actor: currentUser(req), email, role, origin: appOrigin(ctx),
        });
        res.status(201).json({ invitation });
      },
    },
    {
      method: 'delete', path: '/projects/:id/invitations/:invitationId', access: { kind: 'project', role: 'owner', via: 'project' },
      summary: 'Withdraws a pending invitation.',
      response: noContent,
      handler: async (req, res) => {
        const { invitationId } = params(req, { id: idField, invitationId: idField });
        await revokeInvitation(ctx.db, authorizedProject(res).projectId, currentUser(req).id, invitationId);
        res.status(204).end();
      },
    },
    {
      method: 'get', path: '/invitations/:invitationToken', access: { kind: 'public' },
      summary: 'What an invitation offers: project, role, address.',
      response: wrapped('invitation', invitationFactsSchema),
      before: [limits.invitationReads],
      handler: async (req, res) => {
        const { invitationToken } = params(req, { invitationToken: secretTokenField });
        res.json({ invitation: await describeInvitation(ctx.db, invitationToken) });
      },
    },
    {
      method: 'post', path: '/invitations/:invitationToken/accept', access: { kind: 'signed-in' },
      summary: 'Joins the project and answers it; only for the invited address.',
      response: wrapped('project', projectSchema),
      handler: async (req, res) => {
        const { invitationToken } = params(req, { invitationToken: secretTokenField });
        const user = currentUser(req);
        const { projectId } = await acceptInvitation(ctx.db, invitationToken, user);
        res.json({ project: await getProject(ctx.db, projectId, user.id) });
      },
    },
  ];
}
