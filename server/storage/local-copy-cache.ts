/**
 * Local copies of stored objects that must be read from a disk file (HDF5
 * needs random access), kept in a folder of this process and reused by
 * later requests and jobs instead of being downloaded each time. Object
 * keys never change content, so a copy never goes stale.
 *
 * Each reader holds a lease: a hard link to the copy, so the copy's bytes
 * stay readable until the lease is released even if it is evicted
 * meanwhile. Copies no one holds are evicted least recently used first
 * once the folder passes its byte budget. Held is judged from the disk
 * (the copy's link count), so a copy another thread reads is never chosen.
 *
 * The job threads of one process share the folder, and a key is downloaded
 * once per process: askers in this thread join the download in flight, and
 * askers in other threads wait on its lock file (see fill-lock.ts). A copy
 * appears under its name only complete (written aside, then renamed), and a
 * failed download leaves nothing behind, so the next asker starts afresh.
 */
import { createHash, randomBytes } from 'node:crypto';
import { link, mkdir, readdir, rename, rm, stat, unlink, utimes } from 'node:fs/promises';
import { join } from 'node:path';
import { FillLocks } from './fill-lock.ts';

export interface LocalCopy {
  /** A file holding the copy, readable until `release`. */
  path: string;
  release(): Promise<void>;
}

/** Writes the object's bytes to a new file at `path`. */
export type Fill = (path: string) => Promise<void>;

const COPY = '.copy';
/**
 * A reader that finds no copy after a download (evicted in between, or
 * another thread's download failed) tries again, at most this many times.
 */
const MAX_ATTEMPTS = 5;

export class LocalCopyCache {
  /** Downloads this object ran, waits for one already running (in this thread or another), and reads that found a copy. */
  readonly stats = { fills: 0, joins: 0, hits: 0 };
  private readonly leases: string;
  private readonly filling = new Map<string, Promise<void>>();
  private readonly locks: FillLocks;
  /** Last use stamped, in ms: strictly increasing, so two uses in one millisecond still keep their order. */
  private clock = 0;
  private evicting: Promise<void> = Promise.resolve();
  private ready: Promise<void> | null = null;

  constructor(readonly dir: string, readonly budgetBytes: number) {
    if (!(budgetBytes > 0)) throw new RangeError(`the local copy budget must be a positive number of bytes, got ${budgetBytes}`);
    this.leases = join(dir, 'leases');
    this.locks = new FillLocks(`ergodic-local-copies:${dir}`);
  }

  /** The copy of `key`, made by `fill` when this process has none. */
  async acquire(key: string, fill: Fill): Promise<LocalCopy> {
    this.ready ??= mkdir(this.leases, { recursive: true }).then(() => undefined);
    await this.ready;
    const copy = this.copyPath(key);
    let filled = false;
    for (let attempt = 1; ; attempt++) {
      const lease = join(this.leases, `${this.nameOf(key)}-${unique()}`);
      try {
        await link(copy, lease);
      } catch (error) {
        if ((error as NodeJS.ErrnoException).code !== 'ENOENT') throw error;
        if (attempt > MAX_ATTEMPTS) {
          throw new Error(`no local copy of ${key} could be kept in ${this.dir} after ${MAX_ATTEMPTS} downloads (evicted or failed each time)`);
        }
        await this.fillOnce(key, copy, fill);
        filled = true;
        continue;
      }
      if (!filled) this.stats.hits++;
      this.clock = Math.max(Date.now(), this.clock + 1);
      // The copy's modification time is its last use (threads share it through the disk): eviction goes by it.
      await utimes(copy, this.clock / 1000, this.clock / 1000).catch(() => undefined);
      // Held now, so room is made around it (a copy larger than the budget goes once released).
      await this.evict();
      let released = false;
      return {
        path: lease,
        release: async () => {
          if (released) return;
          released = true;
          await unlink(lease).catch(() => undefined);
          await this.evict();
        },
      };
    }
  }

  /** Forgets the copy of `key` (its object was deleted); readers holding it keep theirs until they release. */
  async drop(key: string): Promise<void> {
    await rm(this.copyPath(key), { force: true });
  }

  /** Bytes of the copies in the folder (held or not). */
  async sizeBytes(): Promise<number> {
    return (await this.entries()).reduce((sum, e) => sum + e.size, 0);
  }

  /** Whether the folder holds a copy of `key`. */
  async has(key: string): Promise<boolean> {
    return stat(this.copyPath(key)).then(() => true, () => false);
  }

  /** Removes the folder and every copy in it (at the end of the process). */
  async clear(): Promise<void> {
    this.ready = null;
    await rm(this.dir, { recursive: true, force: true });
  }

  private nameOf(key: string): string {
    return createHash('sha256').update(key).digest('hex').slice(0, 40);
  }

  private copyPath(key: string): string {
    return join(this.dir, `${this.nameOf(key)}${COPY}`);
  }

  /**
   * One download per key at a time: askers in this object join the one in
   * flight; across threads the lock file decides who downloads. The file
   * appears under its name only when complete.
   */
  private fillOnce(key: string, copy: string, fill: Fill): Promise<void> {
    let pending = this.filling.get(key);
    if (pending) {
      this.stats.joins++;
      return pending;
    }
    pending = (async () => {
      await this.locks.run(`${copy}.lock`, async () => {
        // Another thread may have finished between our missing link and winning the lock.
        if (await stat(copy).then(() => true, () => false)) return;
        this.stats.fills++;
        const partial = `${copy}.${unique()}.part`;
        try {
          await fill(partial);
          await rename(partial, copy);
        } finally {
          await rm(partial, { force: true });
        }
      }, () => this.stats.joins++);
    })().finally(() => this.filling.delete(key));
    this.filling.set(key, pending);
    return pending;
  }

  private async entries(): Promise<{ path: string; size: number; usedAt: number; held: boolean }[]> {
    let names: string[];
    try {
      names = await readdir(this.dir);
    } catch {
      return [];
    }
    const out = [];
    for (const name of names) {
      if (!name.endsWith(COPY)) continue;
      const path = join(this.dir, name);
      const info = await stat(path).catch(() => null);
      // More than one link: a reader holds a lease on it.
      if (info) out.push({ path, size: info.size, usedAt: info.mtimeMs, held: info.nlink > 1 });
    }
    return out;
  }

  /** Removes copies no one holds, least recently used first, until the folder is within its budget. */
  private evict(): Promise<void> {
    this.evicting = this.evicting.then(async () => {
      const entries = await this.entries();
      let total = entries.reduce((sum, e) => sum + e.size, 0);
      for (const entry of entries.filter((e) => !e.held).sort((a, b) => a.usedAt - b.usedAt)) {
        if (total <= this.budgetBytes) break;
        await rm(entry.path, { force: true });
        total -= entry.size;
      }
    }).catch(() => undefined);
    return this.evicting;
  }
}

/** A name part no other thread or object of this process picks. */
function unique(): string {
  return randomBytes(8).toString('hex');
}
