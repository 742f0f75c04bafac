/**
 * A process that dies cannot clean up after itself: the next worker to
 * start removes the job folders and the local-copy folder of every process
 * that no longer runs, and leaves those of running processes alone.
 */
import { spawnSync } from 'node:child_process';
import { mkdir, mkdtemp, readdir, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { removeOrphanedJobTempDirs } from '../../server/jobs/job-temp-dir.ts';

let root: string;
beforeEach(async () => {
  root = await mkdtemp(join(tmpdir(), 'ergodic-orphans-test-'));
});
afterEach(async () => {
  await rm(root, { recursive: true, force: true });
});

describe('temp folders of processes that ended', () => {
  it('when a process has ended, then its job folders and its local copies go, and a running process keeps its own', async () => {
    // The id of a process that has certainly ended: one that was started and waited for.
    const ended = spawnSync(process.execPath, ['-e', '0']).pid!;
    const mine = process.pid;
    const names = [`ergodic-job-${ended}-a1`, `ergodic-copies-${ended}`, `ergodic-job-${mine}-b2`, `ergodic-copies-${mine}`, 'ergodic-copies-elsewhere', 'unrelated'];
    for (const name of names) await mkdir(join(root, name));
    expect(await removeOrphanedJobTempDirs(root)).toBe(2);
    expect((await readdir(root)).sort()).toEqual([`ergodic-copies-${mine}`, `ergodic-job-${mine}-b2`, 'ergodic-copies-elsewhere', 'unrelated'].sort());
  });
});
