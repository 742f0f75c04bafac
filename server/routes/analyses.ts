import { z } from 'zod';
import { authorizedProject, currentUser } from '../auth/authorize.ts';
import type { AppContext } from '../context.ts';
import { cancelRun, getRun, listProjectRuns, listRuns, startRun } from '../services/analysis-runs.ts';
import { estimateRun } from '../services/run-costs.ts';
import { runEstimateSchema } from '../../shared/run-estimate.ts';
import { analysisRunSchema, startAnalysisSchema } from '../../shared/analysis-run.ts';
import { body, idField, params } from './request-parts.ts';
import { wrapped, type RouteDef } from './route-table.ts';

export function analysisRoutes(ctx: AppContext): RouteDef[] {
  return [
    {
      method: 'post', path: '/trajectories/:id/analyses', access: { kind: 'project', role: 'editor', via: 'trajectory' },
      summary: "Queues analyses of a ready trajectory as one job; 400 when a setting is out of bounds (also for the range the trajectory's cell implies); 409 while it is not ready or states no time between frames; 422 when the frame selection cannot work or the estimated cost is past the site's limits (with the estimate and advice).",
      request: { body: startAnalysisSchema }, response: wrapped('job', analysisRunSchema, 202),
      handler: async (req, res) => {
        const { id } = params(req, { id: idField });
        const { analyses, params: settings, notes } = body(req, startAnalysisSchema);
        res.status(202).json({ job: await startRun(ctx, id, currentUser(req).id, analyses, settings, notes) });
      },
    },
    {
      method: 'post', path: '/trajectories/:id/analyses/estimate', access: { kind: 'project', role: 'viewer', via: 'trajectory' },
      summary: "What a run would cost before it is queued: estimated time and memory, the frames it would use, and whether it is within the site's limits (with advice when not). Starts nothing.",
      request: { body: startAnalysisSchema }, response: wrapped('estimate', runEstimateSchema),
      handler: async (req, res) => {
        const { id } = params(req, { id: idField });
        const { analyses, params: settings } = body(req, startAnalysisSchema);
        res.json({ estimate: await estimateRun(ctx, id, analyses, settings) });
      },
    },
    {
      method: 'get', path: '/trajectories/:id/analyses', access: { kind: 'project', role: 'viewer', via: 'trajectory' },
      summary: "The trajectory's jobs, newest first.",
      response: wrapped('jobs', z.array(analysisRunSchema)),
      handler: async (req, res) => {
        const { id } = params(req, { id: idField });
        res.json({ jobs: await listRuns(ctx, id) });
      },
    },
    {
      method: 'get', path: '/projects/:id/analyses', access: { kind: 'project', role: 'viewer', via: 'project' },
      summary: "The project's latest 100 jobs, newest first, whoever started them: status, progress, failure reason, report id.",
      response: wrapped('jobs', z.array(analysisRunSchema)),
      handler: async (_req, res) => {
        res.json({ jobs: await listProjectRuns(ctx, authorizedProject(res).projectId) });
      },
    },
    {
      method: 'get', path: '/jobs/:id', access: { kind: 'project', role: 'viewer', via: 'job' },
      summary: 'One job: status queued → running → done | failed | cancelled, progress 0–100, attempts, error, report id.',
      response: wrapped('job', analysisRunSchema),
      handler: async (req, res) => {
        const { id } = params(req, { id: idField });
        res.json({ job: await getRun(ctx, id) });
      },
    },
    {
      method: 'post', path: '/jobs/:id/cancel', access: { kind: 'project', role: 'editor', via: 'job' },
      summary: 'Cancels a queued or running job; 409 once it has ended.',
      response: wrapped('job', analysisRunSchema),
      handler: async (req, res) => {
        const { id } = params(req, { id: idField });
        res.json({ job: await cancelRun(ctx, id) });
      },
    },
  ];
}
