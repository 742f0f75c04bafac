import express, { Router } from 'express';
import { authorize } from '../auth/authorize.ts';
import { identityMiddleware } from '../auth/identity.ts';
import type { AppContext } from '../context.ts';
import { accessLinkRoutes } from './access-links.ts';
import { adminRoutes } from './admin.ts';
import { analysisRoutes } from './analyses.ts';
import { auditRoutes } from './audit.ts';
import { authRoutes } from './auth.ts';
import { commentRoutes } from './comments.ts';
import { healthRoutes } from './health.ts';
import { interactionModelRoutes } from './interaction-models.ts';
import { invitationRoutes } from './invitations.ts';
import { memberRoutes } from './members.ts';
import { openApiRoutes } from './openapi.ts';
import { projectRoutes } from './projects.ts';
import { reportRoutes } from './reports.ts';
import { seriesRoutes } from './series.ts';
import type { RouteDef } from './route-table.ts';
import { markGuard, markSharedMiddleware } from './stack-marks.ts';
import { tokenRoutes } from './tokens.ts';
import { trajectoryRoutes } from './trajectories.ts';

/** Every API route, each with its access rule; the authorization matrix test reads this. */
export function routeTable(ctx: AppContext): RouteDef[] {
  const table: RouteDef[] = [
    ...healthRoutes(ctx),
    ...authRoutes(ctx),
    ...tokenRoutes(ctx),
    ...projectRoutes(ctx),
    ...memberRoutes(ctx),
    ...invitationRoutes(ctx),
    ...auditRoutes(ctx),
    ...trajectoryRoutes(ctx),
    ...interactionModelRoutes(ctx),
    ...analysisRoutes(ctx),
    ...reportRoutes(ctx),
    ...accessLinkRoutes(ctx),
    ...commentRoutes(ctx),
    ...seriesRoutes(ctx),
    ...adminRoutes(ctx),
  ];
  table.push(...openApiRoutes(() => table));
  return table;
}

/** Mounts the route table under /api, with the access rule checked before each handler. */
export function apiRouter(ctx: AppContext): Router {
  const router = Router();
  for (const middleware of [express.json({ limit: '1mb' }), ...identityMiddleware(ctx)]) {
    router.use(markSharedMiddleware(middleware));
  }
  for (const def of routeTable(ctx)) {
    router[def.method](def.path, markGuard(authorize(ctx, def.access), def.access), ...(def.before ?? []), def.handler);
  }
  return router;
}
