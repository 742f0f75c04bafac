import { and, desc, eq, lt } from 'drizzle-orm';
import type { TrajectoryDto, TrajectoryMetadata } from '../../shared/trajectory.ts';
import type { AppContext } from '../context.ts';
import { projects, trajectories, users, type TrajectoryRow } from '../db/schema/index.ts';
import { notFound } from '../errors.ts';
import type { StoredUpload } from './upload-to-store.ts';

const withUploader = {
  t: trajectories,
  uploaderName: users.displayName,
};

export function toTrajectoryDto(row: TrajectoryRow, uploaderName: string): TrajectoryDto {
  return {
    id: row.id, projectId: row.projectId, name: row.name, sizeBytes: row.sizeBytes, sha256: row.sha256,
    format: row.format, compression: row.compression, status: row.status, error: row.error,
    atoms: row.atoms, frames: row.frames, speciesCounts: row.speciesCounts ?? null, cell: row.cell ?? null,
    cellChanges: row.cellChanges, hasVelocities: row.hasVelocities, timeStep: row.timeStep,
    timeUnit: row.timeUnit, lengthUnit: row.lengthUnit, velocityUnit: row.velocityUnit,
    temperatureK: row.temperatureK, ensemble: row.ensemble, boundary: row.boundary,
    potential: row.potential, engine: row.engine, notes: row.notes, fromFile: row.fromFile ?? [],
    uploadedBy: { id: row.uploadedBy, displayName: uploaderName }, createdAt: row.createdAt.toISOString(),
  };
}

export async function listTrajectories(ctx: AppContext, projectId: number): Promise<TrajectoryDto[]> {
  const rows = await ctx.db.select(withUploader).from(trajectories)
    .innerJoin(users, eq(users.id, trajectories.uploadedBy))
    .where(eq(trajectories.projectId, projectId)).orderBy(desc(trajectories.createdAt), desc(trajectories.id));
  return rows.map((r) => toTrajectoryDto(r.t, r.uploaderName));
}

export async function getTrajectoryRow(ctx: AppContext, id: number): Promise<TrajectoryRow> {
  const [row] = await ctx.db.select().from(trajectories).where(eq(trajectories.id, id));
  if (!row) throw notFound('Trajectory');
  return row;
}

export async function getTrajectory(ctx: AppContext, id: number): Promise<TrajectoryDto> {
  const [row] = await ctx.db.select(withUploader).from(trajectories)
    .innerJoin(users, eq(users.id, trajectories.uploadedBy)).where(eq(trajectories.id, id));
  if (!row) throw notFound('Trajectory');
  return toTrajectoryDto(row.t, row.uploaderName);
}

/** A row for an upload that has begun; other members see it as `uploading`. */
export async function beginUpload(ctx: AppContext, projectId: number, userId: number, fileName: string, objectKey: string): Promise<number> {
  const [{ id }] = await ctx.db.insert(trajectories).values({
    projectId, uploadedBy: userId, name: fileName.slice(0, 255) || 'trajectory', objectKey, status: 'uploading', updatedAt: new Date(),
  }).$returningId();
  return id;
}

/** An upload that never completed leaves nothing: no row, and its object is aborted by the caller. */
export async function abandonUpload(ctx: AppContext, id: number): Promise<void> {
  await ctx.db.delete(trajectories).where(and(eq(trajectories.id, id), eq(trajectories.status, 'uploading')));
}

/**
 * Uploads whose web process went away mid-stream never finish: after a
 * while their rows are dropped (the object store aborts incomplete
 * multipart uploads on its own schedule). Returns how many were dropped.
 */
export async function dropStaleUploads(ctx: AppContext, olderThanMs = 6 * 3600_000): Promise<number> {
  const cutoff = new Date(Date.now() - olderThanMs);
  const stale = await ctx.db.select({ id: trajectories.id }).from(trajectories)
    .where(and(eq(trajectories.status, 'uploading'), lt(trajectories.createdAt, cutoff)));
  for (const { id } of stale) await abandonUpload(ctx, id);
  return stale.length;
}

/** Records the stored bytes and the uploader's metadata, and queues the inspection. */
export async function completeUpload(ctx: AppContext, stored: StoredUpload, metadata: TrajectoryMetadata): Promise<TrajectoryDto> {
  const id = stored.trajectoryId;
  await ctx.db.update(trajectories).set({
    sizeBytes: stored.sizeBytes, sha256: stored.sha256, status: 'inspecting', updatedAt: new Date(), ...metadataColumns(metadata),
  }).where(eq(trajectories.id, id));
  const row = await getTrajectoryRow(ctx, id);
  await touchProject(ctx, row.projectId);
  await ctx.queue.add('inspect', { trajectoryId: id }, `inspect-${id}`);
  return getTrajectory(ctx, id);
}

/** A file already in the store (demo seed, imports) registered in one step. */
export async function registerStoredFile(
  ctx: AppContext, projectId: number, userId: number, fileName: string, stored: Omit<StoredUpload, 'trajectoryId'>, metadata: TrajectoryMetadata,
): Promise<TrajectoryDto> {
  const trajectoryId = await beginUpload(ctx, projectId, userId, fileName, stored.objectKey);
  return completeUpload(ctx, { ...stored, trajectoryId }, metadata);
}

function metadataColumns(m: TrajectoryMetadata): Partial<typeof trajectories.$inferInsert> {
  const out: Partial<typeof trajectories.$inferInsert> = {};
  for (const [key, value] of Object.entries(m)) {
    if (value !== undefined) (out as Record<string, unknown>)[key] = value;
  }
  return out;
}

/** Applies the uploader's corrections; a typed-in value is no longer "from the file". */
export async function updateMetadata(ctx: AppContext, id: number, metadata: TrajectoryMetadata): Promise<TrajectoryDto> {
  const row = await getTrajectoryRow(ctx, id);
  const changed = Object.keys(metadata);
  const fromFile = (row.fromFile ?? []).filter((f) => !changed.includes(f));
  await ctx.db.update(trajectories).set({ ...metadataColumns(metadata), fromFile, updatedAt: new Date() }).where(eq(trajectories.id, id));
  await touchProject(ctx, row.projectId);
  return getTrajectory(ctx, id);
}

export async function deleteTrajectory(ctx: AppContext, id: number): Promise<void> {
  const row = await getTrajectoryRow(ctx, id);
  await ctx.db.delete(trajectories).where(eq(trajectories.id, id));
  for (const key of [row.objectKey, row.frameIndexKey]) {
    if (key) await ctx.store.delete(key).catch((err: Error) => ctx.log.warn({ key, err: err.message }, 'could not delete object'));
  }
  await touchProject(ctx, row.projectId);
}

export async function touchProject(ctx: AppContext, projectId: number): Promise<void> {
  await ctx.db.update(projects).set({ lastActivityAt: new Date() }).where(eq(projects.id, projectId));
}
