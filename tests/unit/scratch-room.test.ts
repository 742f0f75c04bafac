import { mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it, vi } from 'vitest';
import { scratchShortfall, ScratchTooSmall, withScratch } from '../../server/out-of-core/scratch.ts';

const parent = mkdtempSync(join(tmpdir(), 'ergodic-scratch-room-'));
afterAll(() => rmSync(parent, { recursive: true, force: true }));

describe('room for a run\'s scratch file', () => {
  it('when the disk has less free than the coordinates need, then the shortfall names both sizes, the folder and what to change', () => {
    expect(scratchShortfall(12 * 1024 ** 3, 3 * 1024 ** 3, '/scratch/jobs')).toBe(
      'The run\'s coordinates need about 12 GiB of scratch disk in /scratch/jobs, which has 3.0 GiB free: '
      + 'analyse fewer frames (a larger stride or a shorter range), or point TMPDIR (JOB_TEMP_DIR for workers) at a larger disk.');
    expect(scratchShortfall(3 * 1024 ** 3, 3 * 1024 ** 3, '/scratch/jobs')).toBeNull();
  });

  it('when a run needs more scratch than any disk holds, then it is refused before the work starts and no folder is made', async () => {
    const use = vi.fn(async () => 'ran');
    const refused = withScratch(96 * 1024 ** 2, use, parent, 2 ** 60);
    await expect(refused).rejects.toBeInstanceOf(ScratchTooSmall);
    await expect(refused).rejects.toThrow(new RegExp(`of scratch disk in ${parent}, which has .* free`));
    expect(use).not.toHaveBeenCalled();
    expect(readdirSync(parent)).toEqual([]);
  });

  it('when the coordinates fit in memory, then the disk is not asked and the work runs in a folder removed afterwards', async () => {
    let seen = '';
    expect(await withScratch(96 * 1024 ** 2, async (spill) => {
      seen = spill.directory;
      return 'ran';
    }, parent, 2 ** 20)).toBe('ran');
    expect(seen.startsWith(join(parent, 'ergodic-scratch-'))).toBe(true);
    expect(readdirSync(parent)).toEqual([]);
  });
});
