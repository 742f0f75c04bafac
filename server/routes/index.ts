import express, { Router } from 'express';
import { authorize } from '../auth/authorize.ts';
import type { AppContext } from '../context.ts';
import { healthRoutes } from './health.ts';
import type { RouteDef } from './route-table.ts';

/** Every API route, each with its access rule; the authorization matrix test reads this. */
export function routeTable(ctx: AppContext): RouteDef[] {
  return [
    ...healthRoutes(ctx),
  ];
}

/** Mounts the route table under /api, with the access rule checked before each handler. */
export function apiRouter(ctx: AppContext): Router {
  const router = Router();
  router.use(express.json({ limit: '1mb' }));
  for (const def of routeTable(ctx)) {
    router[def.method](def.path, authorize(ctx, def.access), ...(def.before ?? []), def.handler);
  }
  return router;
}
