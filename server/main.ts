import type { Server } from 'node:http';
import { createApp } from './app.ts';
import { createContext, type RunningContext } from './bootstrap.ts';
import { loadConfig, type Config } from './config.ts';
import { runMigrations } from './db/migrate.ts';
import { dropStaleUploads } from './services/trajectories.ts';
import { startWorker, type RunningWorker } from './jobs/worker.ts';

export interface RunningServer {
  url: string;
  ctx: RunningContext;
  stop(): Promise<void>;
}

/** Migrates, then serves app and API on one port; runs a job worker unless told not to. */
export async function startServer(config: Config = loadConfig()): Promise<RunningServer> {
  const ctx = createContext(config);
  await runMigrations(ctx.db);
  const sweepUploads = async () => {
    const dropped = await dropStaleUploads(ctx).catch((err: Error) => ctx.log.warn({ err: err.message }, 'could not sweep stale uploads'));
    if (dropped) ctx.log.info({ dropped }, 'dropped uploads that never finished');
  };
  await sweepUploads();
  const sweeper = setInterval(() => void sweepUploads(), 60_000);
  sweeper.unref();
  const app = createApp(ctx);
  const worker: RunningWorker | null = config.RUN_WORKER ? await startWorker(config, ctx.log) : null;
  const server: Server = await new Promise((resolve) => {
    const s = app.listen(config.PORT, config.HOST, () => resolve(s));
  });
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : config.PORT;
  const url = `http://${config.HOST}:${port}`;
  ctx.log.info({ url }, 'Ergodic is listening');
  return {
    url,
    ctx,
    async stop() {
      clearInterval(sweeper);
      await new Promise<void>((resolve) => server.close(() => resolve()));
      server.closeAllConnections();
      await worker?.close();
      await ctx.close();
    },
  };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  let config: Config;
  try {
    config = loadConfig();
  } catch (err) {
    console.error(err instanceof Error ? err.message : err);
    process.exit(1);
  }
  const running = await startServer(config);
  const shutdown = async () => {
    await running.stop();
    process.exit(0);
  };
  process.once('SIGINT', shutdown);
  process.once('SIGTERM', shutdown);
}
