import { z } from 'zod';
import { authorizedProject } from '../auth/authorize.ts';
import type { AppContext } from '../context.ts';
import { listProjectAudit } from '../services/audit.ts';
import { auditEntrySchema } from '../../shared/projects.ts';
import { wrapped, type RouteDef } from './route-table.ts';

export function auditRoutes(ctx: AppContext): RouteDef[] {
  return [{
    method: 'get', path: '/projects/:id/audit', access: { kind: 'project', role: 'owner', via: 'project' },
    summary: 'Who changed members, roles, invitations and access links, newest first.',
    response: wrapped('entries', z.array(auditEntrySchema)),
    handler: async (_req, res) => {
      res.json({ entries: await listProjectAudit(ctx.db, authorizedProject(res).projectId) });
    },
  }];
}
