import { startAnalysisSchema } from '../../shared/analysis-run.ts';
import type { AppContext } from '../context.ts';
import { cancelRun, getRun, listRuns, startRun } from '../services/analysis-runs.ts';
import { idParams } from './params.ts';
import type { RouteDef } from './route-table.ts';

export function analysisRoutes(ctx: AppContext): RouteDef[] {
  return [
    {
      method: 'post', path: '/trajectories/:id/analyses', access: { kind: 'project', role: 'editor', via: 'trajectory' },
      handler: async (req, res) => {
        const { id } = idParams.parse(req.params);
        const body = startAnalysisSchema.parse(req.body);
        res.status(202).json(await startRun(ctx, id, req.user!.id, body.analyses, body.params));
      },
    },
    {
      method: 'get', path: '/trajectories/:id/analyses', access: { kind: 'project', role: 'viewer', via: 'trajectory' },
      handler: async (req, res) => {
        res.json(await listRuns(ctx, idParams.parse(req.params).id));
      },
    },
    {
      method: 'get', path: '/jobs/:id', access: { kind: 'project', role: 'viewer', via: 'job' },
      handler: async (req, res) => {
        res.json(await getRun(ctx, idParams.parse(req.params).id));
      },
    },
    {
      method: 'post', path: '/jobs/:id/cancel', access: { kind: 'project', role: 'editor', via: 'job' },
      handler: async (req, res) => {
        res.json(await cancelRun(ctx, idParams.parse(req.params).id));
      },
    },
  ];
}
