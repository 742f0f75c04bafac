import { speciesElementsOf } from '../../../shared/trajectory.ts';
import { UnrecoverableError, type SandboxedJob } from 'bullmq';
import { eq } from 'drizzle-orm';
import type { AppContext } from '../../context.ts';
import { trajectories } from '../../db/schema/index.ts';
import { TrajectoryFormatError } from '../../formats/frame.ts';
import { inspectTrajectory } from '../../formats/inspect.ts';
import { readerLimits } from '../../services/reader-limits.ts';
import { discardIfDeleted, getTrajectoryRow } from '../../services/trajectories.ts';
import { FrameStoreWriter } from '../../frame-store/writer.ts';
import { EquilibrationSeries } from '../../run-plan/equilibration-series.ts';
import { frameStorePrefixFor } from '../../storage/object-keys.ts';
import type { JobAttempt } from '../job-attempt.ts';
import type { InspectJobData } from '../queue.ts';

/**
 * Reads an upload once from the object store: validates every frame, counts
 * atoms, frames and species, notes cell, velocities and time step, and
 * writes the binary frame store that analyses and the viewer read from then
 * on. A malformed file marks only its own trajectory failed, with the
 * reader's message (file, frame, line), and leaves no partial store.
 */
export async function inspectJob(job: SandboxedJob, ctx: AppContext, attempt: JobAttempt = { token: '' }): Promise<unknown> {
  const { trajectoryId } = job.data as InspectJobData;
  const row = await getTrajectoryRow(ctx, trajectoryId).catch(() => null);
  if (!row) return { skipped: 'trajectory deleted' };
  await ctx.db.update(trajectories).set({ status: 'inspecting', error: null }).where(eq(trajectories.id, row.id));
  let lastReport = 0;
  const equilibration = new EquilibrationSeries();
  const store = new FrameStoreWriter(ctx.store, frameStorePrefixFor(row.objectKey), { file: row.name, chunkBytes: ctx.config.FRAME_STORE_CHUNK_BYTES });
  try {
    const stream = await ctx.store.getStream(row.objectKey);
    const result = await inspectTrajectory(stream, row.name, { ...readerLimits(ctx.config, attempt.tempDir), totalBytes: row.sizeBytes }, (p) => {
      const now = Date.now();
      if (now - lastReport < 500) return;
      lastReport = now;
      void job.updateProgress(Math.min(99, Math.round((100 * p.rawBytes) / Math.max(1, row.sizeBytes))));
    }, (frame) => {
      equilibration.add(frame);
      return store.add(frame);
    });
    const { storedBytes } = await store.finish();
    const settled = equilibration.result();
    const fromFile: string[] = [];
    const update: Partial<typeof trajectories.$inferInsert> = {
      status: 'ready', error: null, format: result.format, compression: result.compression,
      atoms: result.atoms, frames: result.frames, speciesCounts: result.speciesCounts, cell: result.cell,
      cellChanges: result.cellChanges, hasVelocities: result.hasVelocities, fileValues: result.fileValues,
      frameStoreKey: store.indexKey, frameStoreBytes: storedBytes, updatedAt: new Date(),
      equilibrationFrame: settled?.frame ?? null, equilibrationSeries: settled?.judgedFrom ?? null,
      // Every species' element: answers given at upload kept, the rest guessed from case-exact symbols for the user to confirm.
      speciesElements: speciesElementsOf(Object.keys(result.speciesCounts), row.speciesElements),
    };
    // Values the file states are pre-filled, unless the uploader already typed them in.
    if (result.timeStep !== undefined && row.timeStep === null && result.timeStep > 0) {
      update.timeStep = result.timeStep;
      fromFile.push('timeStep');
    }
    if (row.boundary === 'periodic' && (!result.cell || (result.pbc && !result.pbc.some(Boolean)))) {
      update.boundary = 'none';
      fromFile.push('boundary');
    } else if (result.cell) {
      fromFile.push('boundary');
    }
    update.fromFile = [...new Set([...(row.fromFile ?? []), ...fromFile])];
    await ctx.db.update(trajectories).set(update).where(eq(trajectories.id, row.id));
    // Deleted while it was being read: what this job wrote under its folder goes too.
    if (await discardIfDeleted(ctx, row.id, row.objectKey)) return { skipped: 'trajectory deleted' };
    return { atoms: result.atoms, frames: result.frames };
  } catch (err) {
    await store.abort().catch((e: Error) => ctx.log.warn({ trajectoryId, err: e.message }, 'could not remove a partial frame store'));
    if (await discardIfDeleted(ctx, row.id, row.objectKey).catch(() => false)) return { skipped: 'trajectory deleted' };
    const readerError = err instanceof TrajectoryFormatError || err instanceof RangeError;
    const message = err instanceof Error ? err.message : String(err);
    if (readerError || job.attemptsMade + 1 >= (job.opts.attempts ?? 1)) {
      await ctx.db.update(trajectories).set({ status: 'failed', error: message, updatedAt: new Date() }).where(eq(trajectories.id, row.id));
    }
    // A bad file will not get better on a retry; a lost connection might.
    throw readerError ? new UnrecoverableError(message) : err;
  }
}
