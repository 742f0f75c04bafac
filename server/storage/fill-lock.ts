/**
 * One filler per name among every thread of a process (and every cache
 * object opened on the same folder), for local copies that must be
 * downloaded once however many job threads ask at the same moment.
 *
 * Why a lock file: creating it with O_CREAT|O_EXCL ('wx') is atomic on a
 * local filesystem, so exactly one asker wins without a coordinator that
 * every thread would have to reach (BullMQ starts the job threads; we do
 * not own their message ports). It lives in the process's folder, so it
 * goes with the folder when the process dies.
 *
 * Waiters are woken by a BroadcastChannel, which reaches every thread of
 * the process, so nobody polls for the end of a download. A thread that is
 * terminated mid-download runs no exit handler and leaves its lock behind:
 * the owner therefore refreshes the lock's modification time while it
 * works, and a lock not refreshed for `staleMs` is taken over (the same
 * rule as the common "stale lock file" schemes). A late owner whose lock
 * was taken over only costs a second download of identical bytes.
 */
import { randomBytes } from 'node:crypto';
import { open, readFile, stat, unlink, utimes } from 'node:fs/promises';
import { BroadcastChannel } from 'node:worker_threads';

/** How a call to `FillLocks.run` ended for its caller. */
export type FillOutcome = 'filled' | 'waited';

/** A lock not refreshed for this long belongs to a thread that is gone. */
const DEFAULT_STALE_MS = 30_000;

export class FillLocks {
  private channel: BroadcastChannel | null = null;
  private readonly waiters = new Map<string, Set<() => void>>();

  constructor(private readonly channelName: string, private readonly staleMs = DEFAULT_STALE_MS) {}

  /**
   * Runs `work` when this caller wins the lock at `lockPath` ('filled'), or
   * waits until the caller holding it is done, well or not ('waited'); the
   * caller then looks for the result and asks again if there is none.
   * `onWait` is called as the wait begins.
   */
  async run(lockPath: string, work: () => Promise<void>, onWait?: () => void): Promise<FillOutcome> {
    // Listening before trying the lock, so the owner's "done" cannot pass unheard in between.
    this.listen();
    for (;;) {
      const token = randomBytes(8).toString('hex');
      const won = await createExclusive(lockPath, token);
      if (won) {
        await this.hold(lockPath, token, work);
        return 'filled';
      }
      if (await this.isStale(lockPath)) {
        await unlink(lockPath).catch(() => undefined);
        continue;
      }
      onWait?.();
      await this.waitForRelease(lockPath);
      return 'waited';
    }
  }

  private async hold(lockPath: string, token: string, work: () => Promise<void>): Promise<void> {
    const refresh = setInterval(() => {
      const now = new Date();
      void utimes(lockPath, now, now).catch(() => undefined);
    }, Math.max(1, Math.floor(this.staleMs / 3)));
    refresh.unref();
    try {
      await work();
    } finally {
      clearInterval(refresh);
      // Only our own lock: after a takeover the file belongs to the new owner.
      const holder = await readFile(lockPath, 'utf8').catch(() => null);
      if (holder === token) await unlink(lockPath).catch(() => undefined);
      this.channel?.postMessage(lockPath);
      this.wake(lockPath);
    }
  }

  private async isStale(lockPath: string): Promise<boolean> {
    const info = await stat(lockPath).catch(() => null);
    return info !== null && Date.now() - info.mtimeMs > this.staleMs;
  }

  /** Resolves when the owner says it is done, or when its lock is gone or stale (looked at every staleMs / 2). */
  private waitForRelease(lockPath: string): Promise<void> {
    return new Promise<void>((resolve) => {
      const set = this.waiters.get(lockPath) ?? new Set();
      this.waiters.set(lockPath, set);
      const check = setInterval(() => void this.released(lockPath).then((yes) => yes && done()), Math.max(1, this.staleMs / 2));
      const done = () => {
        clearInterval(check);
        set.delete(done);
        if (set.size === 0) this.waiters.delete(lockPath);
        resolve();
      };
      set.add(done);
      // The owner may have finished between our failed create and now.
      void this.released(lockPath).then((yes) => yes && done());
    });
  }

  private async released(lockPath: string): Promise<boolean> {
    const info = await stat(lockPath).catch(() => null);
    return info === null || Date.now() - info.mtimeMs > this.staleMs;
  }

  private listen(): void {
    if (this.channel) return;
    this.channel = new BroadcastChannel(this.channelName);
    // Waiting keeps the thread alive through its check timer; the channel alone must not.
    this.channel.unref();
    this.channel.onmessage = (event) => {
      const data: unknown = event.data;
      if (typeof data === 'string') this.wake(data);
    };
  }

  private wake(lockPath: string): void {
    for (const done of [...(this.waiters.get(lockPath) ?? [])]) done();
  }
}

/** Creates the file only if it does not exist yet; false when someone else holds it. */
async function createExclusive(path: string, token: string): Promise<boolean> {
  try {
    const handle = await open(path, 'wx');
    try {
      await handle.writeFile(token);
    } finally {
      await handle.close();
    }
    return true;
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === 'EEXIST') return false;
    throw error;
  }
}
