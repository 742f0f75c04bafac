import { Router } from 'express';
import type { AppContext } from '../context.ts';
import { checkHealth } from '../services/health.ts';

export function healthRouter(ctx: AppContext): Router {
  const router = Router();
  router.get('/health', async (_req, res) => {
    const report = await checkHealth(ctx);
    res.status(report.status === 'ok' ? 200 : 503).json(report);
  });
  return router;
}
