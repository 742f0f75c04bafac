import type { SandboxedJob } from 'bullmq';
import { workerData } from 'node:worker_threads';
import { createContext, type RunningContext } from '../bootstrap.ts';
import type { Config } from '../config.ts';
import { jobHandlers } from './handlers/index.ts';
import { jobTempRoot, withJobTempDir } from './job-temp-dir.ts';

/** What the worker hands each of its threads (see `startWorker`); never read from the environment. */
export interface ProcessorThreadData {
  config: Config;
}

let context: RunningContext | null = null;

function threadConfig(): Config {
  const data = workerData as Partial<ProcessorThreadData> | null;
  if (!data?.config) throw new Error('The job thread was started without its configuration.');
  return data.config;
}

/**
 * Entry point of a sandboxed worker thread. Each thread keeps its own
 * connections, built from the configuration its worker resolved, so a
 * thread always talks to the same database, queue and store as its worker.
 */
export default async function processJob(job: SandboxedJob, token?: string, signal?: AbortSignal): Promise<unknown> {
  context ??= createContext(threadConfig());
  const handler = jobHandlers[job.name];
  if (!handler) throw new Error(`No handler for job kind "${job.name}".`);
  const ctx = context;
  return withJobTempDir(jobTempRoot(ctx.config.JOB_TEMP_DIR), (tempDir) => handler(job, ctx, { token: token ?? '', signal, tempDir }));
}
