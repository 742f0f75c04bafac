import type { SandboxedJob } from 'bullmq';
import { createContext, type RunningContext } from '../bootstrap.ts';
import { loadConfig } from '../config.ts';
import { jobHandlers } from './handlers/index.ts';

let context: RunningContext | null = null;

/**
 * Entry point of a sandboxed worker thread. Each thread keeps its own
 * connections, built from the same environment as the web process.
 */
export default async function processJob(job: SandboxedJob): Promise<unknown> {
  context ??= createContext(loadConfig());
  const handler = jobHandlers[job.name];
  if (!handler) throw new Error(`No handler for job kind "${job.name}".`);
  return handler(job, context);
}
