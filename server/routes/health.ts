import type { AppContext } from '../context.ts';
import { checkHealth } from '../services/health.ts';
import type { RouteDef } from './route-table.ts';

export function healthRoutes(ctx: AppContext): RouteDef[] {
  return [{
    method: 'get', path: '/health', access: { kind: 'public' },
    handler: async (_req, res) => {
      const report = await checkHealth(ctx);
      res.status(report.status === 'ok' ? 200 : 503).json(report);
    },
  }];
}
