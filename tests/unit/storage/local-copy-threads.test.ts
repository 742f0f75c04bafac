/**
 * The job threads of one process share its folder of local copies and
 * download a key once between them: a second asker, in whatever thread,
 * waits for the download in flight and reads the same copy; a failed
 * download leaves nothing behind and the next asker downloads afresh; a
 * lock left by a thread that ended mid-download does not block anyone for
 * good; and eviction by one thread never takes a copy another is reading.
 *
 * Two cache objects over one folder stand for two threads (each job thread
 * builds its own); one test runs real worker threads.
 */
import { createHash } from 'node:crypto';
import { mkdir, mkdtemp, readdir, readFile, rm, utimes, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Worker } from 'node:worker_threads';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { LocalCopyCache } from '../../../server/storage/local-copy-cache.ts';
import { pollUntil } from '../../support/poll.ts';

let root: string;
let dir: string;
beforeEach(async () => {
  root = await mkdtemp(join(tmpdir(), 'ergodic-local-copy-threads-'));
  dir = join(root, 'copies');
});
afterEach(async () => {
  await rm(root, { recursive: true, force: true });
});

/** A fake object store: counts downloads and holds each one back until `open()`. */
function gatedStore(content: string) {
  let open!: () => void;
  const gate = new Promise<void>((resolve) => (open = resolve));
  const store = { downloads: 0, open, failNext: false };
  const fill = async (path: string) => {
    store.downloads++;
    const fail = store.failNext;
    store.failNext = false;
    await gate;
    await writeFile(path, fail ? content.slice(0, 3) : content);
    if (fail) throw new Error('connection reset');
  };
  return { store, fill };
}

/** Files in the folder other than copies and the lease folder: partial downloads and locks. */
const leftovers = async () => (await readdir(dir)).filter((n) => n !== 'leases' && !n.endsWith('.copy'));

describe('local copies shared by the threads of a process', () => {
  it('when two threads ask for the same new key at once, then it is downloaded once and both read the same bytes', async () => {
    const [a, b] = [new LocalCopyCache(dir, 1024), new LocalCopyCache(dir, 1024)];
    const { store, fill } = gatedStore('frames of run 7');
    const first = a.acquire('p/7/run.h5', fill);
    expect(await pollUntil(async () => store.downloads, (n) => n === 1, 10_000)).toBe(1);
    const second = b.acquire('p/7/run.h5', fill);
    expect(await pollUntil(async () => b.stats.joins, (n) => n === 1, 10_000)).toBe(1);
    store.open();
    const [ca, cb] = await Promise.all([first, second]);
    expect([await readFile(ca.path, 'utf8'), await readFile(cb.path, 'utf8')]).toEqual(['frames of run 7', 'frames of run 7']);
    expect(store.downloads).toBe(1);
    expect([a.stats.fills, b.stats.fills]).toEqual([1, 0]);
    await Promise.all([ca.release(), cb.release()]);
    expect(await leftovers()).toEqual([]);
  });

  it('when the download a thread waits for fails, then no partial file is left and the waiting thread downloads it itself', async () => {
    const [a, b] = [new LocalCopyCache(dir, 1024), new LocalCopyCache(dir, 1024)];
    const { store, fill } = gatedStore('frames of run 8');
    store.failNext = true;
    const first = a.acquire('p/8/run.h5', fill);
    expect(await pollUntil(async () => store.downloads, (n) => n === 1, 10_000)).toBe(1);
    const second = b.acquire('p/8/run.h5', fill);
    expect(await pollUntil(async () => b.stats.joins, (n) => n === 1, 10_000)).toBe(1);
    store.open();
    await expect(first).rejects.toThrow('connection reset');
    const copy = await second;
    expect(await readFile(copy.path, 'utf8')).toBe('frames of run 8');
    expect(store.downloads).toBe(2);
    await copy.release();
    expect(await leftovers()).toEqual([]);
  });

  it('when a download fails with no one waiting, then nothing is left and the next ask, in another thread, succeeds', async () => {
    const [a, b] = [new LocalCopyCache(dir, 1024), new LocalCopyCache(dir, 1024)];
    const { store, fill } = gatedStore('frames of run 9');
    store.failNext = true;
    store.open();
    await expect(a.acquire('p/9/run.h5', fill)).rejects.toThrow('connection reset');
    expect(await readdir(dir)).toEqual(['leases']);
    const copy = await b.acquire('p/9/run.h5', fill);
    expect(await readFile(copy.path, 'utf8')).toBe('frames of run 9');
    expect(store.downloads).toBe(2);
    await copy.release();
  });

  it('when a thread ended mid-download and left its lock, then once the lock is stale the next asker downloads', async () => {
    const cache = new LocalCopyCache(dir, 1024);
    const { store, fill } = gatedStore('frames of run 10');
    store.open();
    // The lock a terminated thread leaves: never refreshed since, an hour ago.
    const lock = join(dir, lockNameOf('p/10/run.h5'));
    await mkdir(dir, { recursive: true });
    await writeFile(lock, 'a thread that is gone');
    const anHourAgo = new Date(Date.now() - 3_600_000);
    await utimes(lock, anHourAgo, anHourAgo);
    const copy = await cache.acquire('p/10/run.h5', fill);
    expect(await readFile(copy.path, 'utf8')).toBe('frames of run 10');
    expect(store.downloads).toBe(1);
    await copy.release();
    expect(await leftovers()).toEqual([]);
  });

  it('when one thread evicts to stay within the budget, then a copy another thread is reading is kept and stays readable', async () => {
    const [reader, other] = [new LocalCopyCache(dir, 250), new LocalCopyCache(dir, 250)];
    const fillWith = (text: string) => (path: string) => writeFile(path, text.repeat(100));
    const held = await reader.acquire('a', fillWith('a'));
    for (const key of ['b', 'c', 'd']) await (await other.acquire(key, fillWith(key))).release();
    expect(await reader.has('a')).toBe(true);
    expect(await readFile(held.path, 'utf8')).toBe('a'.repeat(100));
    expect(await other.sizeBytes()).toBeLessThanOrEqual(250);
    await held.release();
  });

  it('when two real worker threads ask for the same new key at once, then one downloads, the other waits, and both read the same bytes', async () => {
    const threads = [0, 1].map(() => new Worker(new URL('./copy-thread.mjs', import.meta.url), {
      workerData: { dir, key: 'p/11/run.h5', content: 'frames of run 11' },
    }));
    const messages = threads.map((thread) => nextMessages(thread));
    const states = await Promise.all(messages.map((m) => m.next()));
    expect(states.map((s) => s.state).sort()).toEqual(['filling', 'waiting']);
    for (const thread of threads) thread.postMessage('go');
    const results = await Promise.all(messages.map((m) => m.next()));
    expect(results.map((r) => r.bytes)).toEqual(['frames of run 11', 'frames of run 11']);
    expect(results.map((r) => r.stats.fills).reduce((x, y) => x + y)).toBe(1);
    await Promise.all(threads.map((thread) => thread.terminate()));
    expect(await leftovers()).toEqual([]);
  });
});

interface ThreadMessage {
  state?: 'filling' | 'waiting';
  bytes?: string;
  stats: { fills: number; joins: number; hits: number };
}

/** The messages of a thread in order; an error or early exit of the thread fails the wait. */
function nextMessages(thread: Worker) {
  const queue: ThreadMessage[] = [];
  const waiting: { resolve: (m: ThreadMessage) => void; reject: (e: Error) => void }[] = [];
  thread.on('message', (m: ThreadMessage) => (waiting.length ? waiting.shift()!.resolve(m) : queue.push(m)));
  thread.on('error', (e) => waiting.splice(0).forEach((w) => w.reject(e)));
  return {
    next: () => (queue.length ? Promise.resolve(queue.shift()!) : new Promise<ThreadMessage>((resolve, reject) => waiting.push({ resolve, reject }))),
  };
}

/** The lock file of `key`: the cache names a key's files by the first 40 hex digits of its SHA-256. */
function lockNameOf(key: string): string {
  return `${createHash('sha256').update(key).digest('hex').slice(0, 40)}.copy.lock`;
}
