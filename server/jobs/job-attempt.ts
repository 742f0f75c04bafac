/**
 * What a job handler learns about the attempt it runs besides the job
 * itself: the queue's lock token for this attempt, and a signal its worker
 * aborts when it shuts down and wants the job handed back to the queue.
 */
export interface JobAttempt {
  token: string;
  signal?: AbortSignal;
  /** This job's own temp folder, removed when the job ends (see job-temp-dir.ts). */
  tempDir?: string;
}

/** The abort reason a worker gives when it is shutting down. */
export const RELEASE_ON_SHUTDOWN = 'worker shutting down';

/** Thrown at a checkpoint when the worker asked for the job back. */
export class AttemptReleased extends Error {
  constructor() {
    super('the worker is shutting down; the job goes back to the queue');
    this.name = 'AttemptReleased';
  }
}

export function releaseRequested(attempt: JobAttempt): boolean {
  return attempt.signal?.aborted === true && attempt.signal.reason === RELEASE_ON_SHUTDOWN;
}
