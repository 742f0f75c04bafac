import express, { Router } from 'express';
import { existsSync } from 'node:fs';
import { resolve } from 'node:path';

/** Serves the built Angular app, with index.html for every client-side route. */
export function staticApp(dir: string): Router {
  const root = resolve(dir);
  const router = Router();
  if (!existsSync(resolve(root, 'index.html'))) return router;
  router.use(express.static(root, { index: false, maxAge: '1h' }));
  router.get('/{*splat}', (req, res, next) => {
    if (req.path.startsWith('/api/')) return next();
    res.setHeader('Cache-Control', 'no-cache');
    res.sendFile(resolve(root, 'index.html'));
  });
  return router;
}
