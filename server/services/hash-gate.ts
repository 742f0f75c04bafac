import { AppError } from '../errors.ts';

/**
 * Bounds how many password hashes run at once. scrypt is slow and memory-hard
 * on purpose and runs on libuv's small thread pool, which file, zlib and
 * crypto work share: without a bound a flood of sign-ins would queue every
 * other request behind it. Excess callers wait in line; past `maxWaiting`
 * they are told to come back instead of piling up.
 */
export class HashGate {
  private running = 0;
  private readonly waiting: (() => void)[] = [];

  constructor(private readonly concurrency: number, private readonly maxWaiting: number) {}

  async run<T>(work: () => Promise<T>): Promise<T> {
    if (this.running >= this.concurrency) {
      if (this.waiting.length >= this.maxWaiting) {
        throw new AppError(503, 'busy', 'Sign-in is busy right now. Try again in a few seconds.', { retryAfterSeconds: 5 });
      }
      await new Promise<void>((resolve) => this.waiting.push(resolve));
    } else {
      this.running++;
    }
    try {
      return await work();
    } finally {
      const next = this.waiting.shift();
      // The slot passes straight to the next in line, so `running` stays as it is.
      if (next) next();
      else this.running--;
    }
  }

  get inUse(): number {
    return this.running;
  }
}

/** Two hashes at a time leave half of libuv's default four threads for everything else. */
export const passwordHashGate = new HashGate(2, 64);
