import type { Request, Response } from 'express';
import { z } from 'zod';
import { authorizedProject, currentUser } from '../auth/authorize.ts';
import { apiRateLimits } from '../auth/rate-limits.ts';
import type { AppContext } from '../context.ts';
import { createSeriesAccessLink, listSeriesAccessLinks, resolveAccessLink, revokeSeriesAccessLink } from '../services/access-links.ts';
import { addComment, listComments } from '../services/comments.ts';
import { seriesOverlays } from '../services/series/series-curves.ts';
import { seriesTableCsv } from '../services/series/series-table.ts';
import { createSeries, deleteSeries, getSeries, listSeries, patchSeries, starterFor } from '../services/series/series.ts';
import { syncSeries } from '../services/series/series-sync.ts';
import { AppError } from '../errors.ts';
import { secretTokenField } from '../../shared/accounts.ts';
import {
  createSeriesAccessLinkBody, createSeriesBody, newSeriesAccessLinkSchema, patchSeriesBody, seriesAccessLinkSchema,
  seriesCurvesSchema, seriesListItemSchema, seriesSchema,
} from '../../shared/series-api.ts';
import { commentBody, commentSchema } from '../../shared/sharing.ts';
import { appOrigin, body, idField, params } from './request-parts.ts';
import { download, noContent, wrapped, type RouteDef } from './route-table.ts';

/** Series of runs (state-point studies), their overlays, exports, links and comments. */
export function seriesRoutes(ctx: AppContext): RouteDef[] {
  const limits = apiRateLimits(ctx);
  /** The caller as a reader of the series: whether their read may start its missing analyses is the service's rule. */
  const reader = (req: Request, res: Response) => ({ id: currentUser(req).id, role: authorizedProject(res).role });
  /** A project member's read may start missing work (see starterFor); a link holder's starts nothing. */
  const curvesFor = async (id: number, starter: number | null) => seriesOverlays(ctx, await syncSeries(ctx, id, { requesterId: starter }));
  return [
    {
      method: 'post', path: '/projects/:id/series', access: { kind: 'project', role: 'editor', via: 'project' },
      summary: "A series of two or more ready trajectories of one system (same species) in the project, in the order given; starts each member's missing analyses, reusing finished reports with the same settings. 400 names the field.",
      request: { body: createSeriesBody }, response: wrapped('series', seriesSchema, 201),
      handler: async (req, res) => {
        const input = body(req, createSeriesBody);
        res.status(201).json({ series: await createSeries(ctx, authorizedProject(res).projectId, currentUser(req).id, input) });
      },
    },
    {
      method: 'get', path: '/projects/:id/series', access: { kind: 'project', role: 'viewer', via: 'project' },
      summary: "The project's series, newest first, with status, temperature range, E_a and melting bracket.",
      response: wrapped('series', z.array(seriesListItemSchema)),
      handler: async (_req, res) => {
        res.json({ series: await listSeries(ctx, authorizedProject(res).projectId) });
      },
    },
    {
      method: 'get', path: '/series/:id', access: { kind: 'project', role: 'viewer', via: 'series' },
      summary: "A series: members with their state points and per-member progress, status (running, ready, incomplete) and results (D(T) and Arrhenius fit, phases with evidence, melting and boiling brackets, caloric curve, Cv(T)), methods and caution.",
      response: wrapped('series', seriesSchema),
      handler: async (req, res) => {
        const { id } = params(req, { id: idField });
        res.json({ series: await getSeries(ctx, id, reader(req, res)) });
      },
    },
    {
      method: 'patch', path: '/series/:id', access: { kind: 'project', role: 'editor', via: 'series' },
      summary: 'Renames, reorders, adds or removes members, marks members excluded from fits or on a heating/cooling branch, or retries failed members; results are recomputed.',
      request: { body: patchSeriesBody }, response: wrapped('series', seriesSchema),
      handler: async (req, res) => {
        const { id } = params(req, { id: idField });
        const input = body(req, patchSeriesBody);
        res.json({ series: await patchSeries(ctx, id, currentUser(req).id, input) });
      },
    },
    {
      method: 'delete', path: '/series/:id', access: { kind: 'project', role: 'editor', via: 'series' },
      summary: "Deletes the series (its members' trajectories and reports stay).",
      response: noContent,
      handler: async (req, res) => {
        const { id } = params(req, { id: idField });
        await deleteSeries(ctx, id, currentUser(req).id);
        res.status(204).end();
      },
    },
    {
      method: 'get', path: '/series/:id/curves', access: { kind: 'project', role: 'viewer', via: 'series' },
      summary: "Overlays: every member's MSD, VACF, VDOS, g(r) and S(q) on shared axes, with its temperature and phase.",
      response: wrapped('curves', seriesCurvesSchema),
      handler: async (req, res) => {
        const { id } = params(req, { id: idField });
        res.json({ curves: await curvesFor(id, await starterFor(ctx, id, reader(req, res))) });
      },
    },
    {
      method: 'get', path: '/series/:id/export.json', access: { kind: 'project', role: 'viewer', via: 'series' },
      summary: 'The series document as a download.',
      response: download('application/json', 'The series document: the same object as `series` in GET /api/series/{id}.', seriesSchema),
      handler: async (req, res) => {
        const { id } = params(req, { id: idField });
        const dto = await getSeries(ctx, id, reader(req, res));
        res.setHeader('Content-Disposition', `attachment; filename="ergodic-series-${id}.json"`);
        res.json(dto);
      },
    },
    {
      method: 'get', path: '/series/:id/members.csv', access: { kind: 'project', role: 'viewer', via: 'series' },
      summary: 'One row per member: state point, D with its error, Lindemann ratio, density, energy, phase; units in the header.',
      response: download('text/csv', 'The members table as CSV: a header row of columns with units, then one row per member.'),
      handler: async (req, res) => {
        const { id } = params(req, { id: idField });
        res.setHeader('Content-Disposition', `attachment; filename="ergodic-series-${id}-members.csv"`);
        res.type('text/csv').send(seriesTableCsv(await getSeries(ctx, id, reader(req, res))));
      },
    },
    {
      method: 'post', path: '/series/:id/access-link', access: { kind: 'project', role: 'editor', via: 'series' },
      summary: 'A read-only link to the series; its token is shown this once.',
      request: { body: createSeriesAccessLinkBody }, response: wrapped('link', newSeriesAccessLinkSchema, 201),
      handler: async (req, res) => {
        const { id } = params(req, { id: idField });
        const { expiresInDays } = body(req, createSeriesAccessLinkBody);
        const link = await createSeriesAccessLink(ctx.db, id, currentUser(req).id, expiresInDays);
        res.status(201).json({ link: { ...link, url: `${appOrigin(ctx)}/links/${link.token}` } });
      },
    },
    {
      method: 'get', path: '/series/:id/access-links', access: { kind: 'project', role: 'editor', via: 'series' },
      summary: "The series' links (without tokens), revoked and expired ones included.",
      response: wrapped('links', z.array(seriesAccessLinkSchema)),
      handler: async (req, res) => {
        const { id } = params(req, { id: idField });
        res.json({ links: await listSeriesAccessLinks(ctx.db, id) });
      },
    },
    {
      method: 'delete', path: '/series/:id/access-links/:linkId', access: { kind: 'project', role: 'editor', via: 'series' },
      summary: 'Revokes a link to the series.',
      response: noContent,
      handler: async (req, res) => {
        const { id, linkId } = params(req, { id: idField, linkId: idField });
        await revokeSeriesAccessLink(ctx.db, id, currentUser(req).id, linkId);
        res.status(204).end();
      },
    },
    {
      method: 'get', path: '/series/:id/comments', access: { kind: 'project', role: 'viewer', via: 'series' },
      summary: 'Comments on a series, oldest first.',
      response: wrapped('comments', z.array(commentSchema)),
      handler: async (req, res) => {
        const { id } = params(req, { id: idField });
        res.json({ comments: await listComments(ctx.db, { seriesId: id }) });
      },
    },
    {
      method: 'post', path: '/series/:id/comments', access: { kind: 'project', role: 'viewer', via: 'series' },
      summary: 'Adds a comment to a series.',
      request: { body: commentBody }, response: wrapped('comment', commentSchema, 201),
      before: [limits.comments],
      handler: async (req, res) => {
        const { id } = params(req, { id: idField });
        const comment = await addComment(ctx.db, { seriesId: id }, currentUser(req), body(req, commentBody).body);
        res.status(201).json({ comment });
      },
    },
    {
      method: 'get', path: '/links/:token/series-curves', access: { kind: 'public' },
      summary: 'The overlays of the series behind a link (as GET /api/series/{id}/curves).',
      response: wrapped('curves', seriesCurvesSchema),
      before: [limits.accessLinkReads],
      handler: async (req, res) => {
        const { token } = params(req, { token: secretTokenField });
        const link = await resolveAccessLink(ctx.db, token);
        if (link.seriesId === null) throw new AppError(404, 'not_found', 'This link shares a report, not a series.');
        res.json({ curves: await curvesFor(link.seriesId, null) });
      },
    },
  ];
}
