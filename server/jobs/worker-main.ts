import { loadConfig } from '../config.ts';
import { createLogger } from '../logger.ts';
import { startWorker } from './worker.ts';

/** `npm run worker`: the same worker as the web process runs, as a process of its own. */
const config = loadConfig();
const log = createLogger(config.LOG_LEVEL);
const running = await startWorker(config, log);
const shutdown = async () => {
  await running.close();
  process.exit(0);
};
process.once('SIGINT', shutdown);
process.once('SIGTERM', shutdown);
