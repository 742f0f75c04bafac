import { loadConfig } from '../config.ts';
import { createLogger } from '../logger.ts';
import { startWorker } from './worker.ts';

/**
 * `npm run worker`, and the worker process `npm start` runs beside the web
 * server: the same worker as a process of its own. SIGTERM or SIGINT lets
 * running jobs finish within the grace period, then hands the rest back to
 * the queue; a second SIGINT (Ctrl-C twice) stops at once, and their jobs
 * return to the queue when their locks lapse.
 */
const config = loadConfig();
const log = createLogger(config.LOG_LEVEL);
const running = await startWorker(config, log);
let stopping = false;
const shutdown = async (why: string) => {
  if (stopping) {
    if (why === 'SIGINT') process.exit(1);
    return;
  }
  stopping = true;
  log.info({ why }, 'job worker stopping');
  try {
    await running.close();
  } finally {
    process.exit(0);
  }
};
process.on('SIGINT', () => void shutdown('SIGINT'));
process.on('SIGTERM', () => void shutdown('SIGTERM'));
// Started by a web server: go when it goes, however it went.
if (process.send) process.on('disconnect', () => void shutdown('the web server went away'));
