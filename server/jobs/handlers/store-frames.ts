import { type SandboxedJob } from 'bullmq';
import { and, eq, isNull } from 'drizzle-orm';
import type { AppContext } from '../../context.ts';
import { trajectories } from '../../db/schema/index.ts';
import { FrameStoreWriter } from '../../frame-store/writer.ts';
import { storedFrames } from '../../services/stored-trajectory.ts';
import { discardIfDeleted, getTrajectoryRow } from '../../services/trajectories.ts';
import { frameStorePrefixFor } from '../../storage/object-keys.ts';
import type { JobAttempt } from '../job-attempt.ts';
import type { StoreFramesJobData } from '../queue.ts';

/**
 * Writes the binary frame store of a trajectory inspected before the store
 * existed, queued the first time its frames are viewed: one more pass over
 * the file, after which the viewer and analyses read the store instead of
 * decompressing the file from its first byte for every chunk. The
 * trajectory stays ready throughout; a failure leaves it read from its
 * file as before, with no partial store.
 */
export async function storeFramesJob(job: SandboxedJob, ctx: AppContext, attempt: JobAttempt = { token: '' }): Promise<unknown> {
  const { trajectoryId } = job.data as StoreFramesJobData;
  const row = await getTrajectoryRow(ctx, trajectoryId).catch(() => null);
  if (!row) return { skipped: 'trajectory deleted' };
  if (row.frameStoreKey) return { skipped: 'the frames are already stored' };
  if (row.status !== 'ready') return { skipped: `the trajectory is ${row.status}` };
  const store = new FrameStoreWriter(ctx.store, frameStorePrefixFor(row.objectKey), { file: row.name, chunkBytes: ctx.config.FRAME_STORE_CHUNK_BYTES });
  try {
    let frames = 0;
    for await (const frame of storedFrames(ctx, row, {}, attempt.tempDir)) {
      await store.add(frame);
      frames++;
    }
    const { storedBytes } = await store.finish();
    await ctx.db.update(trajectories).set({ frameStoreKey: store.indexKey, frameStoreBytes: storedBytes })
      .where(and(eq(trajectories.id, row.id), isNull(trajectories.frameStoreKey)));
    // Deleted while it was being read: what this job wrote under its folder goes too.
    if (await discardIfDeleted(ctx, row.id, row.objectKey)) return { skipped: 'trajectory deleted' };
    return { frames, storedBytes };
  } catch (err) {
    await store.abort().catch((e: Error) => ctx.log.warn({ trajectoryId, err: e.message }, 'could not remove a partial frame store'));
    if (await discardIfDeleted(ctx, row.id, row.objectKey).catch(() => false)) return { skipped: 'trajectory deleted' };
    throw err;
  }
}

