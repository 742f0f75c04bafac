import { z } from 'zod';
import { currentUser } from '../auth/authorize.ts';
import type { AppContext } from '../context.ts';
import { createAccessLink, listAccessLinks, resolveAccessLink, revokeAccessLink } from '../services/access-links.ts';
import { getReport } from '../services/reports.ts';
import { ACCESS_LINK_MAX_DAYS } from '../../shared/account-rules.ts';
import { curveField, sendCurveCsv } from './curve-csv.ts';
import { appOrigin, body, idField, params, tokenField } from './request-parts.ts';
import type { RouteDef } from './route-table.ts';

const createBody = z.object({
  expiresInDays: z.number({ error: 'must be a number of days' }).int('must be a whole number of days')
    .min(1, 'must be at least 1 day').max(ACCESS_LINK_MAX_DAYS, `must be at most ${ACCESS_LINK_MAX_DAYS} days`),
}).strict();

/** Read-only, expiring, revocable links to one report, for readers outside the project. */
export function accessLinkRoutes(ctx: AppContext): RouteDef[] {
  return [
    {
      method: 'post', path: '/reports/:id/access-link', access: { kind: 'project', role: 'editor', via: 'report' },
      handler: async (req, res) => {
        const { id } = params(req, { id: idField });
        const { expiresInDays } = body(req, createBody);
        const link = await createAccessLink(ctx.db, id, currentUser(req).id, expiresInDays);
        res.status(201).json({ link: { ...link, url: `${appOrigin(ctx, req)}/links/${link.token}` } });
      },
    },
    {
      method: 'get', path: '/reports/:id/access-links', access: { kind: 'project', role: 'editor', via: 'report' },
      handler: async (req, res) => {
        const { id } = params(req, { id: idField });
        res.json({ links: await listAccessLinks(ctx.db, id) });
      },
    },
    {
      method: 'delete', path: '/reports/:id/access-links/:linkId', access: { kind: 'project', role: 'editor', via: 'report' },
      handler: async (req, res) => {
        const { id, linkId } = params(req, { id: idField, linkId: idField });
        await revokeAccessLink(ctx.db, id, currentUser(req).id, linkId);
        res.status(204).end();
      },
    },
    {
      method: 'get', path: '/links/:token', access: { kind: 'public' },
      handler: async (req, res) => {
        const { token } = params(req, { token: tokenField });
        const link = await resolveAccessLink(ctx.db, token);
        res.json({ report: await getReport(ctx, link.reportId), expiresAt: link.expiresAt });
      },
    },
    {
      method: 'get', path: '/links/:token/export.json', access: { kind: 'public' },
      handler: async (req, res) => {
        const { token } = params(req, { token: tokenField });
        const link = await resolveAccessLink(ctx.db, token);
        res.setHeader('Content-Disposition', `attachment; filename="ergodic-report-${link.reportId}.json"`);
        res.json(await getReport(ctx, link.reportId));
      },
    },
    {
      method: 'get', path: '/links/:token/curves/:curve.csv', access: { kind: 'public' },
      handler: async (req, res) => {
        const { token, curve } = params(req, { token: tokenField, curve: curveField });
        const link = await resolveAccessLink(ctx.db, token);
        await sendCurveCsv(ctx, res, link.reportId, curve);
      },
    },
  ];
}
