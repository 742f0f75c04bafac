import { Worker } from 'bullmq';
import { createContext } from '../bootstrap.ts';
import type { Config } from '../config.ts';
import type { AppContext } from '../context.ts';
import type { Logger } from '../logger.ts';
import { redisConnection } from './connection.ts';
import { RELEASE_ON_SHUTDOWN } from './job-attempt.ts';
import type { ProcessorThreadData } from './processor.ts';
import { QUEUE_NAME } from './queue.ts';
import { jobTempRoot, removeOrphanedJobTempDirs } from './job-temp-dir.ts';
import { requeueStranded } from './requeue-stranded.ts';
import { removeLocalCopiesOnExit } from '../services/local-copies.ts';

export interface RunningWorker {
  worker: Worker;
  /**
   * Stops taking jobs and lets running ones finish for `graceMs` (default
   * WORKER_SHUTDOWN_GRACE_MS); then asks them to hand their run back to the
   * queue at their next checkpoint, where another worker starts it afresh.
   */
  close(graceMs?: number): Promise<void>;
}

const processorFile = new URL('./processor-entry.mjs', import.meta.url);

/**
 * A BullMQ worker whose jobs run in sandboxed worker threads, so a long
 * analysis never blocks this process's event loop. Each thread gets this
 * worker's resolved configuration as thread data, never from the
 * environment. Jobs of a worker that died are picked up again by BullMQ's
 * stalled-job check; work whose queue entry was lost, by a periodic sweep.
 */
export async function startWorker(config: Config, log: Logger, shared?: AppContext): Promise<RunningWorker> {
  // Temp folders of jobs whose process died (a crash cannot clean up after itself).
  const orphans = await removeOrphanedJobTempDirs(jobTempRoot(config.JOB_TEMP_DIR));
  if (orphans) log.info({ orphans }, 'removed temp folders of jobs whose process had ended');
  // The job threads keep local copies in this process's folder; it goes when the process does.
  removeLocalCopiesOnExit(config);
  const connection = redisConnection(config.REDIS_URL);
  const threadData: ProcessorThreadData = { config };
  const worker = new Worker(QUEUE_NAME, processorFile, {
    connection,
    concurrency: config.WORKER_CONCURRENCY,
    useWorkerThreads: true,
    workerThreadsOptions: { workerData: threadData },
    stalledInterval: config.WORKER_STALLED_INTERVAL_MS,
    lockDuration: config.WORKER_LOCK_MS,
    maxStalledCount: 2,
  });
  worker.on('failed', (job, err) => log.warn({ jobId: job?.id, name: job?.name, err: err.message }, 'job failed'));
  worker.on('error', (err) => log.error({ err }, 'worker error'));
  await worker.waitUntilReady();

  const own = shared ? null : createContext(config);
  const ctx = shared ?? own!;
  const sweep = () => requeueStranded(ctx).then(
    (n) => { if (n.runs || n.inspections) log.info(n, 'queued again work whose queue entry was lost'); },
    (err: Error) => log.warn({ err: err.message }, 'could not look for lost work'),
  );
  void sweep();
  const sweepTimer = setInterval(() => void sweep(), config.WORKER_SWEEP_INTERVAL_MS);
  sweepTimer.unref();

  log.info({ concurrency: config.WORKER_CONCURRENCY }, 'job worker started');
  return {
    worker,
    async close(graceMs = config.WORKER_SHUTDOWN_GRACE_MS) {
      clearInterval(sweepTimer);
      const release = setTimeout(() => worker.cancelAllJobs(RELEASE_ON_SHUTDOWN), graceMs);
      try {
        await worker.close();
      } finally {
        clearTimeout(release);
        connection.disconnect();
        await own?.close();
      }
    },
  };
}
