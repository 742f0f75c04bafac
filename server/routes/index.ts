import express, { Router } from 'express';
import type { AppContext } from '../context.ts';
import { healthRouter } from './health.ts';

/** Every API router, mounted under /api. */
export function apiRouter(ctx: AppContext): Router {
  const router = Router();
  router.use(express.json({ limit: '1mb' }));
  router.use(healthRouter(ctx));
  return router;
}
