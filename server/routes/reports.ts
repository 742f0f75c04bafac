import { z } from 'zod';
import type { AppContext } from '../context.ts';
import { getReportHead, listReports } from '../services/reports.ts';
import { curvesPlaceholder, sendWithStoredCurves } from '../services/report-stream.ts';
import { reportListItemSchema, reportSchema } from '../../shared/report.ts';
import { curveField, sendCurveCsv } from './curve-csv.ts';
import { idField, params } from './request-parts.ts';
import { download, wrapped, type RouteDef } from './route-table.ts';

export function reportRoutes(ctx: AppContext): RouteDef[] {
  return [
    {
      method: 'get', path: '/projects/:id/reports', access: { kind: 'project', role: 'viewer', via: 'project' },
      summary: "The project's reports, newest first.",
      response: wrapped('reports', z.array(reportListItemSchema)),
      handler: async (req, res) => {
        const { id } = params(req, { id: idField });
        res.json({ reports: await listReports(ctx, id) });
      },
    },
    {
      method: 'get', path: '/reports/:id', access: { kind: 'project', role: 'viewer', via: 'report' },
      summary: 'A report: headline summary per analysis, methods (parameters, engine version, input checksum), curves.',
      response: wrapped('report', reportSchema),
      handler: async (req, res) => {
        const { id } = params(req, { id: idField });
        const { report, curvesKey } = await getReportHead(ctx, id);
        await sendWithStoredCurves(ctx, req, res, { report: { ...report, curves: curvesPlaceholder } }, curvesKey);
      },
    },
    {
      method: 'get', path: '/reports/:id/export.json', access: { kind: 'project', role: 'viewer', via: 'report' },
      summary: 'The report document as a download.',
      response: download('application/json', 'The report document: the same object as `report` in GET /api/reports/{id}.', reportSchema),
      handler: async (req, res) => {
        const { id } = params(req, { id: idField });
        const { report, curvesKey } = await getReportHead(ctx, id);
        res.setHeader('Content-Disposition', `attachment; filename="ergodic-report-${id}.json"`);
        await sendWithStoredCurves(ctx, req, res, { ...report, curves: curvesPlaceholder }, curvesKey);
      },
    },
    {
      method: 'get', path: '/reports/:id/curves/:curve.csv', access: { kind: 'project', role: 'viewer', via: 'report' },
      summary: 'One curve as CSV with units in the header.',
      response: download('text/csv', 'The curve as CSV: a header row of columns with units, then one row per point.'),
      handler: async (req, res) => {
        const { id, curve } = params(req, { id: idField, curve: curveField });
        await sendCurveCsv(ctx, res, id, curve);
      },
    },
  ];
}
