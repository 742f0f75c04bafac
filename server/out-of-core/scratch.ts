/**
 * A private scratch folder for coordinates that outgrow memory, removed
 * when the work that needed it is done (or failed).
 */
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { AssembleSpill } from '../formats/assemble.ts';

/**
 * Positions and velocities held in memory up to this many bytes; beyond it
 * they go to a scratch file. Small enough that a whole process stays well
 * under 300 MB with the engine's own buffers, large enough that ordinary
 * runs (500 atoms × 5000 frames with velocities is 60 MB) never touch disk.
 */
export const IN_MEMORY_COORDINATE_BYTES = 96 * 1024 * 1024;

export async function withScratch<T>(memoryBytes: number, use: (spill: AssembleSpill) => Promise<T>, parent = tmpdir()): Promise<T> {
  const directory = await mkdtemp(join(parent, 'ergodic-scratch-'));
  try {
    return await use({ directory, memoryBytes });
  } finally {
    await rm(directory, { recursive: true, force: true });
  }
}
