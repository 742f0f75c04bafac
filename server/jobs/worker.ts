import { Worker } from 'bullmq';
import type { Config } from '../config.ts';
import type { Logger } from '../logger.ts';
import { redisConnection } from './connection.ts';
import { QUEUE_NAME } from './queue.ts';

export interface RunningWorker {
  worker: Worker;
  close(): Promise<void>;
}

const processorFile = new URL('./processor-entry.mjs', import.meta.url);

/**
 * A BullMQ worker whose jobs run in sandboxed worker threads, so a long
 * analysis never blocks the web process's event loop and a crash in one job
 * does not take the server down. Stalled jobs (a worker that died) are picked
 * up again by BullMQ's stalled-job check.
 */
export async function startWorker(config: Config, log: Logger): Promise<RunningWorker> {
  const connection = redisConnection(config.REDIS_URL);
  const worker = new Worker(QUEUE_NAME, processorFile, {
    connection,
    concurrency: config.WORKER_CONCURRENCY,
    useWorkerThreads: true,
    stalledInterval: config.WORKER_STALLED_INTERVAL_MS,
    lockDuration: config.WORKER_LOCK_MS,
    maxStalledCount: 2,
  });
  worker.on('failed', (job, err) => log.warn({ jobId: job?.id, name: job?.name, err: err.message }, 'job failed'));
  worker.on('error', (err) => log.error({ err }, 'worker error'));
  await worker.waitUntilReady();
  log.info({ concurrency: config.WORKER_CONCURRENCY }, 'job worker started');
  return {
    worker,
    async close() {
      await worker.close();
      connection.disconnect();
    },
  };
}
