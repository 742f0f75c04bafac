import type { AppContext } from '../context.ts';
import { checkHealth } from '../services/health.ts';
import { healthSchema } from '../../shared/health.ts';
import { wrapped, type RouteDef } from './route-table.ts';

export function healthRoutes(ctx: AppContext): RouteDef[] {
  return [{
    method: 'get', path: '/health', access: { kind: 'public' },
    summary: 'Database, queue, storage and mail status, and the app version (503 when a service is down).',
    response: wrapped('health', healthSchema),
    handler: async (_req, res) => {
      const health = await checkHealth(ctx);
      res.status(health.status === 'ok' ? 200 : 503).json({ health });
    },
  }];
}
