/**
 * This process's local copies of H5MD uploads (see storage/local-copy-cache.ts):
 * one folder per process under JOB_TEMP_DIR, named with the process id so
 * the next worker to start removes it when the process died without
 * cleaning up, and removed at a normal exit.
 */
import { rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { isMainThread } from 'node:worker_threads';
import type { Config } from '../config.ts';
import { LocalCopyCache } from '../storage/local-copy-cache.ts';

/** Folder name of a process's local copies; job-temp-dir.ts recognises it to remove a dead process's folder. */
export const LOCAL_COPIES_PREFIX = 'ergodic-copies-';

const caches = new Map<string, LocalCopyCache>();
const cleaned = new Set<string>();

function folderOf(config: Config): string {
  return join(config.JOB_TEMP_DIR ?? tmpdir(), `${LOCAL_COPIES_PREFIX}${process.pid}`);
}

/** The cache of this process (every thread opens the same folder). */
export function localCopies(config: Config): LocalCopyCache {
  const dir = folderOf(config);
  let cache = caches.get(dir);
  if (!cache) {
    cache = new LocalCopyCache(dir, config.H5MD_COPY_CACHE_BYTES);
    caches.set(dir, cache);
    if (isMainThread) removeLocalCopiesOnExit(config);
  }
  return cache;
}

/**
 * Removes the process's folder when the process exits. Called by the
 * process's main thread: job threads come and go while the process and
 * its copies stay.
 */
export function removeLocalCopiesOnExit(config: Config): void {
  const dir = folderOf(config);
  if (cleaned.has(dir)) return;
  cleaned.add(dir);
  process.once('exit', () => rmSync(dir, { recursive: true, force: true }));
}
