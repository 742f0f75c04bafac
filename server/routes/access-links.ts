import { z } from 'zod';
import { currentUser } from '../auth/authorize.ts';
import { apiRateLimits } from '../auth/rate-limits.ts';
import type { AppContext } from '../context.ts';
import { createAccessLink, listAccessLinks, resolveAccessLink, resolveReportLink, revokeAccessLink } from '../services/access-links.ts';
import { getLinkedSeries } from '../services/series/series.ts';
import { linkedSeriesSchema, seriesSchema } from '../../shared/series-api.ts';
import { getReportHead } from '../services/reports.ts';
import { curvesPlaceholder, sendWithStoredCurves } from '../services/report-stream.ts';
import { secretTokenField } from '../../shared/accounts.ts';
import { linkedReportSchema, reportSchema } from '../../shared/report.ts';
import { accessLinkSchema, createAccessLinkBody, newAccessLinkSchema } from '../../shared/sharing.ts';
import { curveField, sendCurveCsv } from './curve-csv.ts';
import { appOrigin, body, idField, params } from './request-parts.ts';
import { download, noContent, wrapped, type RouteDef } from './route-table.ts';

/** Read-only, expiring, revocable links to one report, for readers outside the project. */
export function accessLinkRoutes(ctx: AppContext): RouteDef[] {
  const limits = apiRateLimits(ctx);
  return [
    {
      method: 'post', path: '/reports/:id/access-link', access: { kind: 'project', role: 'editor', via: 'report' },
      summary: 'A read-only link to the report; its token is shown this once.',
      request: { body: createAccessLinkBody }, response: wrapped('link', newAccessLinkSchema, 201),
      handler: async (req, res) => {
        const { id } = params(req, { id: idField });
        const { expiresInDays } = body(req, createAccessLinkBody);
        const link = await createAccessLink(ctx.db, id, currentUser(req).id, expiresInDays);
        res.status(201).json({ link: { ...link, url: `${appOrigin(ctx)}/links/${link.token}` } });
      },
    },
    {
      method: 'get', path: '/reports/:id/access-links', access: { kind: 'project', role: 'editor', via: 'report' },
      summary: "The report's links (without tokens), revoked and expired ones included.",
      response: wrapped('links', z.array(accessLinkSchema)),
      handler: async (req, res) => {
        const { id } = params(req, { id: idField });
        res.json({ links: await listAccessLinks(ctx.db, id) });
      },
    },
    {
      method: 'delete', path: '/reports/:id/access-links/:linkId', access: { kind: 'project', role: 'editor', via: 'report' },
      summary: 'Revokes a link.',
      response: noContent,
      handler: async (req, res) => {
        const { id, linkId } = params(req, { id: idField, linkId: idField });
        await revokeAccessLink(ctx.db, id, currentUser(req).id, linkId);
        res.status(204).end();
      },
    },
    {
      method: 'get', path: '/links/:token', access: { kind: 'public' },
      summary: 'The report or series behind a valid, unexpired, unrevoked link, read only, and when the link expires: `{link: {expiresAt, report}}` or `{link: {expiresAt, series}}`.',
      response: wrapped('link', z.union([linkedReportSchema, linkedSeriesSchema])),
      before: [limits.accessLinkReads],
      handler: async (req, res) => {
        const { token } = params(req, { token: secretTokenField });
        const link = await resolveAccessLink(ctx.db, token);
        if (link.seriesId !== null) {
          res.json({ link: { expiresAt: link.expiresAt.toISOString(), series: await getLinkedSeries(ctx, link.seriesId) } });
          return;
        }
        const { report, curvesKey } = await getReportHead(ctx, link.reportId as number);
        await sendWithStoredCurves(ctx, req, res, { link: { expiresAt: link.expiresAt.toISOString(), report: { ...report, curves: curvesPlaceholder } } }, curvesKey);
      },
    },
    {
      method: 'get', path: '/links/:token/export.json', access: { kind: 'public' },
      summary: 'The report or series document behind a link, as a download.',
      response: download('application/json', 'The report document (the same object as `report` in GET /api/reports/{id}) or the series document (as `series` in GET /api/series/{id}).', z.union([reportSchema, seriesSchema])),
      before: [limits.accessLinkReads],
      handler: async (req, res) => {
        const { token } = params(req, { token: secretTokenField });
        const link = await resolveAccessLink(ctx.db, token);
        if (link.seriesId !== null) {
          res.setHeader('Content-Disposition', `attachment; filename="ergodic-series-${link.seriesId}.json"`);
          res.json(await getLinkedSeries(ctx, link.seriesId));
          return;
        }
        const { report, curvesKey } = await getReportHead(ctx, link.reportId as number);
        res.setHeader('Content-Disposition', `attachment; filename="ergodic-report-${link.reportId}.json"`);
        await sendWithStoredCurves(ctx, req, res, { ...report, curves: curvesPlaceholder }, curvesKey);
      },
    },
    {
      method: 'get', path: '/links/:token/curves/:curve.csv', access: { kind: 'public' },
      summary: 'One curve of the report behind a link, as CSV with units in the header.',
      response: download('text/csv', 'The curve as CSV: a header row of columns with units, then one row per point.'),
      before: [limits.accessLinkReads],
      handler: async (req, res) => {
        const { token, curve } = params(req, { token: secretTokenField, curve: curveField });
        const link = await resolveReportLink(ctx.db, token);
        await sendCurveCsv(ctx, res, link.reportId, curve);
      },
    },
  ];
}
