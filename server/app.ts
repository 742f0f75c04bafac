import express, { type Express } from 'express';
import type { AppContext } from './context.ts';
import { errorHandler, notFoundHandler } from './errors.ts';
import { apiRouter } from './routes/index.ts';
import { securityHeaders } from './security-headers.ts';
import { staticApp } from './static-app.ts';

/** Builds the Express app without listening, so tests can drive it in-process. */
export function createApp(ctx: AppContext): Express {
  const app = express();
  app.disable('x-powered-by');
  if (ctx.config.TRUST_PROXY) app.set('trust proxy', 1);
  app.use(securityHeaders(ctx.config.PUBLIC_URL?.startsWith('https://') ?? false));
  app.use('/api', apiRouter(ctx));
  app.use('/api', notFoundHandler);
  app.use(staticApp(ctx.config.STATIC_DIR));
  app.use(errorHandler(ctx.log));
  return app;
}
