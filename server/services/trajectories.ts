import { and, desc, eq, inArray, sql } from 'drizzle-orm';
import { localCopies } from './local-copies.ts';
import { confirmedElement, speciesElementsOf, type SpeciesElement, type TrajectoryDto, type TrajectoryMetadata } from '../../shared/trajectory.ts';
import { AppError } from '../errors.ts';
import type { AppContext } from '../context.ts';
import { projects, trajectories, users, type TrajectoryRow } from '../db/schema/index.ts';
import { badRequest, notFound } from '../errors.ts';
import { trajectoryPrefix } from '../storage/object-keys.ts';
import { describeForbiddenCharacter } from '../../shared/plain-text.ts';
import type { StoredUpload } from './upload-to-store.ts';

const withUploader = {
  t: trajectories,
  uploaderName: users.displayName,
  projectHasModel: sql<number>`(${projects.interactionModel} IS NOT NULL)`,
};

export function toTrajectoryDto(row: TrajectoryRow, uploaderName: string, projectHasModel = false): TrajectoryDto {
  return {
    id: row.id, projectId: row.projectId, name: row.name, sizeBytes: row.sizeBytes, frameStoreBytes: row.frameStoreBytes, sha256: row.sha256,
    equilibration: row.equilibrationFrame === null ? null : { frame: row.equilibrationFrame, judgedFrom: row.equilibrationSeries ?? 'a per-frame series' },
    format: row.format, compression: row.compression, status: row.status, error: row.error,
    atoms: row.atoms, frames: row.frames, speciesCounts: row.speciesCounts ?? null, cell: row.cell ?? null,
    speciesElements: speciesElementsOf(Object.keys(row.speciesCounts ?? {}), row.speciesElements),
    cellChanges: row.cellChanges, hasVelocities: row.hasVelocities, timeStep: row.timeStep,
    timeUnit: row.timeUnit, lengthUnit: row.lengthUnit, velocityUnit: row.velocityUnit,
    temperatureK: row.temperatureK, ensemble: row.ensemble, boundary: row.boundary, constraints: row.constraints,
    potential: row.potential, engine: row.engine, notes: row.notes, fromFile: row.fromFile ?? [],
    fileValues: row.fileValues ?? [], fileQuantities: row.fileQuantities ?? null,
    interactionModelSource: row.interactionModel ? 'trajectory' : projectHasModel ? 'project' : null,
    uploadedBy: { id: row.uploadedBy, displayName: uploaderName }, createdAt: row.createdAt.toISOString(),
  };
}

export async function listTrajectories(ctx: AppContext, projectId: number): Promise<TrajectoryDto[]> {
  const rows = await ctx.db.select(withUploader).from(trajectories)
    .innerJoin(users, eq(users.id, trajectories.uploadedBy)).innerJoin(projects, eq(projects.id, trajectories.projectId))
    .where(eq(trajectories.projectId, projectId)).orderBy(desc(trajectories.createdAt), desc(trajectories.id));
  return rows.map((r) => toTrajectoryDto(r.t, r.uploaderName, Boolean(Number(r.projectHasModel))));
}

export async function getTrajectoryRow(ctx: AppContext, id: number): Promise<TrajectoryRow> {
  const [row] = await ctx.db.select().from(trajectories).where(eq(trajectories.id, id));
  if (!row) throw notFound('Trajectory');
  return row;
}

export async function getTrajectory(ctx: AppContext, id: number): Promise<TrajectoryDto> {
  const [row] = await ctx.db.select(withUploader).from(trajectories)
    .innerJoin(users, eq(users.id, trajectories.uploadedBy)).innerJoin(projects, eq(projects.id, trajectories.projectId))
    .where(eq(trajectories.id, id));
  if (!row) throw notFound('Trajectory');
  return toTrajectoryDto(row.t, row.uploaderName, Boolean(Number(row.projectHasModel)));
}

/** A file name as the user sent it, checked: no control or direction-override characters, at most 255 characters. */
export function checkedFileName(fileName: string): string {
  const problem = describeForbiddenCharacter(fileName);
  if (problem) throw badRequest(`The file name contains ${problem}: rename the file and upload it again.`);
  const name = fileName.split(/[\\/]/).pop()?.trim() ?? '';
  if (!name) throw badRequest('The file part has no file name: send it with a name such as run.extxyz.');
  if ([...name].length > 255) throw badRequest('The file name is longer than 255 characters: rename the file and upload it again.');
  return name;
}

/** A row for an upload that has begun; other members see it as `uploading`. */
export async function beginUpload(ctx: AppContext, projectId: number, userId: number, fileName: string, objectKey: string): Promise<number> {
  const [{ id }] = await ctx.db.insert(trajectories).values({
    projectId, uploadedBy: userId, name: checkedFileName(fileName), objectKey, status: 'uploading', updatedAt: new Date(),
  }).$returningId();
  return id;
}

/** Bytes are still arriving: the sweep leaves this upload alone. */
export async function touchUpload(ctx: AppContext, id: number): Promise<void> {
  await ctx.db.update(trajectories).set({ updatedAt: new Date() }).where(and(eq(trajectories.id, id), eq(trajectories.status, 'uploading')));
}

/** An upload that never completed leaves nothing: no row, no object under its folder. */
export async function abandonUpload(ctx: AppContext, id: number, objectKey?: string): Promise<void> {
  const [gone] = await ctx.db.delete(trajectories).where(and(eq(trajectories.id, id), eq(trajectories.status, 'uploading')));
  if (objectKey && gone.affectedRows === 1) {
    await ctx.store.deletePrefix(trajectoryPrefix(objectKey))
      .catch((err: Error) => ctx.log.warn({ objectKey, err: err.message }, 'could not delete an abandoned upload\'s objects'));
  }
}

/** An upload that has not received a byte for this long has lost its process. */
export const STALE_UPLOAD_MS = 2 * 60_000;

/**
 * Uploads whose web process went away mid-stream never finish, and a live
 * upload renews its row every few seconds: rows quiet for longer than
 * `STALE_UPLOAD_MS` are dropped with their objects. Runs at start and then
 * periodically on every web node. Returns how many were dropped.
 */
export async function dropStaleUploads(ctx: AppContext, quietForMs = STALE_UPLOAD_MS): Promise<number> {
  const cutoff = new Date(Date.now() - quietForMs);
  const stale = await ctx.db.select({ id: trajectories.id, objectKey: trajectories.objectKey }).from(trajectories)
    .where(and(eq(trajectories.status, 'uploading'), sql`COALESCE(${trajectories.updatedAt}, ${trajectories.createdAt}) < ${cutoff}`));
  for (const { id, objectKey } of stale) await abandonUpload(ctx, id, objectKey);
  return stale.length;
}

/**
 * Records the stored bytes and the uploader's metadata, and queues the
 * inspection. If the queue cannot take the job, the upload is undone (row
 * and object) and the error goes to the caller: no row is left waiting for
 * an inspection that was never queued.
 */
export async function completeUpload(ctx: AppContext, stored: StoredUpload, metadata: TrajectoryMetadata): Promise<TrajectoryDto> {
  const id = stored.trajectoryId;
  const [claimed] = await ctx.db.update(trajectories).set({
    sizeBytes: stored.sizeBytes, sha256: stored.sha256, status: 'inspecting', updatedAt: new Date(), ...metadataColumns(metadata),
  }).where(and(eq(trajectories.id, id), eq(trajectories.status, 'uploading')));
  if (claimed.affectedRows !== 1) throw notFound('Upload (it was removed while it finished)');
  try {
    await ctx.queue.add('inspect', { trajectoryId: id }, `inspect-${id}`);
  } catch (err) {
    await ctx.db.delete(trajectories).where(eq(trajectories.id, id)).catch(() => {});
    await ctx.store.deletePrefix(trajectoryPrefix(stored.objectKey)).catch(() => {});
    throw err;
  }
  const row = await getTrajectoryRow(ctx, id);
  await touchProject(ctx, row.projectId);
  return getTrajectory(ctx, id);
}

/** A file already in the store (demo seed, imports) registered in one step. */
export async function registerStoredFile(
  ctx: AppContext, projectId: number, userId: number, fileName: string, stored: Omit<StoredUpload, 'trajectoryId'>, metadata: TrajectoryMetadata,
): Promise<TrajectoryDto> {
  const trajectoryId = await beginUpload(ctx, projectId, userId, fileName, stored.objectKey);
  return completeUpload(ctx, { ...stored, trajectoryId }, metadata);
}

function metadataColumns(m: TrajectoryMetadata, row?: TrajectoryRow): Partial<typeof trajectories.$inferInsert> {
  const out: Partial<typeof trajectories.$inferInsert> = {};
  for (const [key, value] of Object.entries(m)) {
    if (value !== undefined && key !== 'speciesElements') (out as Record<string, unknown>)[key] = value;
  }
  if (m.speciesElements) out.speciesElements = confirmedSpecies(m.speciesElements, row);
  return out;
}

/**
 * The user's species → element answers, stored as confirmed. On an inspected
 * trajectory every label must be one of its species (a 400 naming the field
 * otherwise) and the other species keep their answers or guesses; before
 * inspection (at upload) they wait for the species the file turns out to have.
 */
function confirmedSpecies(choices: NonNullable<TrajectoryMetadata['speciesElements']>, row?: TrajectoryRow): Record<string, SpeciesElement> {
  const labels = row?.speciesCounts ? Object.keys(row.speciesCounts) : null;
  if (labels) {
    const strangers = Object.keys(choices).filter((l) => !labels.includes(l));
    if (strangers.length) {
      throw new AppError(400, 'invalid_input', `${strangers.map((l) => `"${l}"`).join(', ')} ${strangers.length > 1 ? 'are not species' : 'is not a species'} of ${row!.name}; its species are ${labels.join(', ')}.`,
        strangers.map((l) => ({ field: `speciesElements.${l}`, message: 'not a species of this trajectory' })));
    }
  }
  const confirmed = Object.fromEntries(Object.entries(choices).map(([label, c]) => [label, confirmedElement(c)]));
  return labels ? { ...speciesElementsOf(labels, row!.speciesElements), ...confirmed } : confirmed;
}

/** Applies the uploader's corrections; a typed-in value is no longer "from the file". */
export async function updateMetadata(ctx: AppContext, id: number, metadata: TrajectoryMetadata): Promise<TrajectoryDto> {
  const row = await getTrajectoryRow(ctx, id);
  const changed = Object.keys(metadata);
  const fromFile = (row.fromFile ?? []).filter((f) => !changed.includes(f));
  await ctx.db.update(trajectories).set({ ...metadataColumns(metadata, row), fromFile, updatedAt: new Date() }).where(eq(trajectories.id, id));
  await touchProject(ctx, row.projectId);
  return getTrajectory(ctx, id);
}

/**
 * One metadata change applied to several trajectories of a project, all or
 * none: every id must be a trajectory of this project.
 */
export async function updateMetadataOfMany(ctx: AppContext, projectId: number, ids: readonly number[], metadata: TrajectoryMetadata): Promise<TrajectoryDto[]> {
  const wanted = [...new Set(ids)];
  const rows = await ctx.db.select().from(trajectories).where(and(eq(trajectories.projectId, projectId), inArray(trajectories.id, wanted)));
  const missing = wanted.filter((id) => !rows.some((r) => r.id === id));
  if (missing.length) throw notFound(`Trajectory ${missing.join(', ')} in this project`);
  const changed = Object.keys(metadata);
  await ctx.db.transaction(async (tx) => {
    for (const row of rows) {
      const fromFile = (row.fromFile ?? []).filter((f) => !changed.includes(f));
      await tx.update(trajectories).set({ ...metadataColumns(metadata), fromFile, updatedAt: new Date() }).where(eq(trajectories.id, row.id));
    }
  });
  await touchProject(ctx, projectId);
  return Promise.all(wanted.map((id) => getTrajectory(ctx, id)));
}

/**
 * Deletes a trajectory with everything derived from it (runs, reports and
 * their curves, indexes). The folder is emptied before and after the row
 * goes, so objects a job wrote in between go too; a job that finishes later
 * finds its row gone and removes what it wrote (see `discardIfDeleted`).
 */
export async function deleteTrajectory(ctx: AppContext, id: number): Promise<void> {
  const row = await getTrajectoryRow(ctx, id);
  const prefix = trajectoryPrefix(row.objectKey);
  await ctx.store.deletePrefix(prefix);
  await ctx.db.delete(trajectories).where(eq(trajectories.id, id));
  await ctx.store.deletePrefix(prefix);
  // This process's local copy goes now; another process's goes when its cache needs the room.
  await localCopies(ctx.config).drop(row.objectKey);
  await touchProject(ctx, row.projectId);
}

/**
 * For a job that has just written under a trajectory's folder: if the
 * trajectory was deleted meanwhile, its folder is emptied again and true
 * is returned.
 */
export async function discardIfDeleted(ctx: AppContext, trajectoryId: number, objectKey: string): Promise<boolean> {
  const [row] = await ctx.db.select({ id: trajectories.id }).from(trajectories).where(eq(trajectories.id, trajectoryId));
  if (row) return false;
  await ctx.store.deletePrefix(trajectoryPrefix(objectKey));
  return true;
}

export async function touchProject(ctx: AppContext, projectId: number): Promise<void> {
  await ctx.db.update(projects).set({ lastActivityAt: new Date() }).where(eq(projects.id, projectId));
}
