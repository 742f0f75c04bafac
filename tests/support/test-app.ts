import { inject } from 'vitest';
import { createApp } from '../../server/app.ts';
import { createContext, type RunningContext } from '../../server/bootstrap.ts';
import { loadConfig, type Config } from '../../server/config.ts';
import type { Express } from 'express';

export interface TestApp {
  app: Express;
  ctx: RunningContext;
  config: Config;
  close(): Promise<void>;
}

/** The real app, in-process, wired to the integration stack's services. */
export function createTestApp(overrides: Record<string, string> = {}): TestApp {
  const config = loadConfig({ ...process.env, ...inject('stackEnv'), STATIC_DIR: 'dist/ergodic/browser', ...overrides });
  const ctx = createContext(config);
  return { app: createApp(ctx), ctx, config, close: () => ctx.close() };
}
