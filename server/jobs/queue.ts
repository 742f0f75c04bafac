import { Queue, type JobsOptions } from 'bullmq';
import type { Redis } from 'ioredis';
import { redisConnection } from './connection.ts';

/** One queue carries both kinds of work so one pool of workers serves them. */
export const QUEUE_NAME = 'ergodic-work';

export type JobName = 'inspect' | 'analyse' | 'store-frames';

export interface InspectJobData { trajectoryId: number }
export interface AnalyseJobData { runId: number }
/** The binary frame store of a trajectory inspected before the store existed. */
export interface StoreFramesJobData { trajectoryId: number }
export type JobData = InspectJobData | AnalyseJobData | StoreFramesJobData;

export const DEFAULT_JOB_OPTIONS: JobsOptions = {
  attempts: 3,
  backoff: { type: 'exponential', delay: 2000 },
  removeOnComplete: { age: 24 * 3600, count: 1000 },
  removeOnFail: { age: 7 * 24 * 3600 },
};

export class WorkQueue {
  readonly queue: Queue;
  private readonly connection: Redis;

  /** `addTimeoutMs`: how long `add` waits for Redis before giving up (a down Redis would otherwise hold the caller forever). */
  constructor(redisUrl: string, private readonly addTimeoutMs = 5_000) {
    this.connection = redisConnection(redisUrl);
    this.queue = new Queue(QUEUE_NAME, { connection: this.connection, defaultJobOptions: DEFAULT_JOB_OPTIONS });
  }

  /** Queues a job; a job id already in the queue is not added twice. */
  async add(name: JobName, data: JobData, jobId?: string): Promise<string> {
    let timer: NodeJS.Timeout | undefined;
    const timeout = new Promise<never>((_, reject) => {
      timer = setTimeout(() => reject(new Error(`the job queue did not answer within ${this.addTimeoutMs} ms`)), this.addTimeoutMs);
    });
    try {
      const job = await Promise.race([this.queue.add(name, data, jobId ? { jobId } : undefined), timeout]);
      return String(job.id);
    } finally {
      clearTimeout(timer);
    }
  }

  async ping(): Promise<void> {
    const answer = await this.connection.ping();
    if (answer !== 'PONG') throw new Error(`Redis answered ${answer}`);
  }

  async close(): Promise<void> {
    await this.queue.close();
    this.connection.disconnect();
  }
}
