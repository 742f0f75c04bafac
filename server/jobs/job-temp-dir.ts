/**
 * Every job gets a temp folder of its own, made before its handler runs and
 * removed after it however it ends (done, failed, released or stopped), so
 * a temporary copy can never outlive its job. A process that dies cannot
 * clean up: the next worker to start removes folders whose process is gone.
 */
import { mkdir, mkdtemp, readdir, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const PREFIX = 'ergodic-job-';
/** Job folders and a process's local copies (services/local-copies.ts) carry the owning process's id. */
const OWNED = /^ergodic-(?:job|copies)-(\d+)(?:-|$)/;

/** Where job temp folders go: the configured folder, else the system's temp folder. */
export function jobTempRoot(configured: string | undefined): string {
  return configured ?? tmpdir();
}

export async function withJobTempDir<T>(root: string, run: (dir: string) => Promise<T>): Promise<T> {
  await mkdir(root, { recursive: true });
  // The process id in the name lets a later worker tell a dead job's folder from a running one's.
  const dir = await mkdtemp(join(root, `${PREFIX}${process.pid}-`));
  try {
    return await run(dir);
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
}

function running(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (err) {
    // EPERM: the process exists but belongs to someone else.
    return (err as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/** Removes the temp folders of jobs (and local copies) whose process no longer runs; returns how many went. */
export async function removeOrphanedJobTempDirs(root: string): Promise<number> {
  let names: string[];
  try {
    names = await readdir(root);
  } catch {
    return 0;
  }
  let removed = 0;
  for (const name of names) {
    const owner = OWNED.exec(name);
    if (!owner || running(Number(owner[1]))) continue;
    await rm(join(root, name), { recursive: true, force: true });
    removed++;
  }
  return removed;
}
