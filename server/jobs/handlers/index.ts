import type { SandboxedJob } from 'bullmq';
import type { AppContext } from '../../context.ts';
import type { JobAttempt } from '../job-attempt.ts';
import { analyseJob } from './analyse.ts';
import { inspectJob } from './inspect.ts';
import { storeFramesJob } from './store-frames.ts';

export type JobHandler = (job: SandboxedJob, ctx: AppContext, attempt: JobAttempt) => Promise<unknown>;

/** Job kinds by name; the worker refuses any kind not listed here. */
export const jobHandlers: Record<string, JobHandler> = {
  inspect: inspectJob,
  analyse: analyseJob,
  'store-frames': storeFramesJob,
};
