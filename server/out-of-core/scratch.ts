/**
 * A private scratch folder for coordinates that outgrow memory, removed
 * when the work that needed it is done (or failed).
 */
import { mkdtemp, rm, statfs } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { AssembleSpill } from '../formats/assemble.ts';
import { formatBytes } from '../../shared/byte-size.ts';

/**
 * Positions and velocities held in memory up to this many bytes; beyond it
 * they go to a scratch file. Small enough that a whole process stays well
 * under 300 MB with the engine's own buffers, large enough that ordinary
 * runs (500 atoms × 5000 frames with velocities is 60 MB) never touch disk.
 */
export const IN_MEMORY_COORDINATE_BYTES = 96 * 1024 * 1024;

/** The scratch folder's disk cannot hold the coordinates of the run: refused before any is written. */
export class ScratchTooSmall extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ScratchTooSmall';
  }
}

/** Why `freeBytes` in `parent` cannot hold `neededBytes` of scratch, or null when it can. */
export function scratchShortfall(neededBytes: number, freeBytes: number, parent: string): string | null {
  if (neededBytes <= freeBytes) return null;
  return `The run's coordinates need about ${formatBytes(neededBytes)} of scratch disk in ${parent}, which has ${formatBytes(freeBytes)} free: `
    + 'analyse fewer frames (a larger stride or a shorter range), or point TMPDIR (JOB_TEMP_DIR for workers) at a larger disk.';
}

/**
 * Runs `use` with a scratch folder in `parent`, removed afterwards. When
 * `neededBytes` of coordinates will not fit the memory budget, the disk is
 * asked first, so a run that cannot fit fails at once with a reason rather
 * than after hours of work with a full disk.
 */
export async function withScratch<T>(memoryBytes: number, use: (spill: AssembleSpill) => Promise<T>, parent = tmpdir(), neededBytes = 0): Promise<T> {
  if (neededBytes > memoryBytes) {
    const disk = await statfs(parent);
    const problem = scratchShortfall(neededBytes, disk.bavail * disk.bsize, parent);
    if (problem) throw new ScratchTooSmall(problem);
  }
  const directory = await mkdtemp(join(parent, 'ergodic-scratch-'));
  try {
    return await use({ directory, memoryBytes });
  } finally {
    await rm(directory, { recursive: true, force: true });
  }
}
