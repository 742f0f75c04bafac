import type { Server } from 'node:http';
import { createApp } from './app.ts';
import { createContext, type RunningContext } from './bootstrap.ts';
import { loadConfig, type Config } from './config.ts';
import { runMigrations } from './db/migrate.ts';
import { dropStaleUploads } from './services/trajectories.ts';
import { startWorker } from './jobs/worker.ts';
import { superviseWorkerProcess } from './jobs/worker-process.ts';

export interface RunningServer {
  url: string;
  ctx: RunningContext;
  /** Process id of the worker child (RUN_WORKER=process), else null. */
  workerPid(): number | null;
  stop(): Promise<void>;
}

/**
 * Migrates, then serves app and API on one port. Jobs run in a worker child
 * process by default (RUN_WORKER=process), inside this process when asked
 * (in-process), or elsewhere (off: `npm run worker` on any machine).
 */
export async function startServer(config: Config = loadConfig()): Promise<RunningServer> {
  const ctx = createContext(config);
  ctx.log.info('Ergodic is starting');
  await runMigrations(ctx.db);
  const sweepUploads = async () => {
    const dropped = await dropStaleUploads(ctx).catch((err: Error) => ctx.log.warn({ err: err.message }, 'could not sweep stale uploads'));
    if (dropped) ctx.log.info({ dropped }, 'dropped uploads that never finished');
  };
  await sweepUploads();
  const sweeper = setInterval(() => void sweepUploads(), 60_000);
  sweeper.unref();
  const app = createApp(ctx);
  const worker = config.RUN_WORKER === 'process' ? superviseWorkerProcess(config, ctx.log)
    : config.RUN_WORKER === 'in-process' ? await startWorker(config, ctx.log, ctx) : null;
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
    workerPid: () => (worker && 'pid' in worker ? worker.pid() : null),
    async stop() {
      clearInterval(sweeper);
      await new Promise<void>((resolve) => server.close(() => resolve()));
      server.closeAllConnections();
      if (worker) await ('stop' in worker ? worker.stop() : worker.close());
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
  // Listening for signals from the first moment: a SIGTERM during start-up stops the server as soon as it is up.
  let running: RunningServer | null = null;
  let stopping = false;
  const shutdown = async () => {
    if (stopping) return;
    stopping = true;
    if (!running) return;
    await running.stop();
    process.exit(0);
  };
  process.on('SIGINT', () => void shutdown());
  process.on('SIGTERM', () => void shutdown());
  try {
    running = await startServer(config);
  } catch (err) {
    console.error(err instanceof Error ? err.message : err);
    process.exit(1);
  }
  if (stopping) {
    await running.stop();
    process.exit(0);
  }
}
