import { z } from 'zod';
import type { AppContext } from '../context.ts';
import { getReport, listReports } from '../services/reports.ts';
import { curveField, sendCurveCsv } from './curve-csv.ts';
import { idParams, idSchema } from './params.ts';
import type { RouteDef } from './route-table.ts';

const curveParams = z.object({ id: idSchema, curve: curveField });

export function reportRoutes(ctx: AppContext): RouteDef[] {
  return [
    {
      method: 'get', path: '/projects/:id/reports', access: { kind: 'project', role: 'viewer', via: 'project' },
      handler: async (req, res) => {
        res.json(await listReports(ctx, idParams.parse(req.params).id));
      },
    },
    {
      method: 'get', path: '/reports/:id', access: { kind: 'project', role: 'viewer', via: 'report' },
      handler: async (req, res) => {
        res.json(await getReport(ctx, idParams.parse(req.params).id));
      },
    },
    {
      method: 'get', path: '/reports/:id/export.json', access: { kind: 'project', role: 'viewer', via: 'report' },
      handler: async (req, res) => {
        const { id } = idParams.parse(req.params);
        res.setHeader('Content-Disposition', `attachment; filename="ergodic-report-${id}.json"`);
        res.json(await getReport(ctx, id));
      },
    },
    {
      method: 'get', path: '/reports/:id/curves/:curve.csv', access: { kind: 'project', role: 'viewer', via: 'report' },
      handler: async (req, res) => {
        const { id, curve } = curveParams.parse(req.params);
        await sendCurveCsv(ctx, res, id, curve);
      },
    },
  ];
}
