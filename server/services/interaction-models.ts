/**
 * Interaction models stored with a trajectory or with its project (reused by
 * every trajectory of the project that has none of its own), and the model an
 * energy analysis of a trajectory uses.
 */
import { eq } from 'drizzle-orm';
import { GUESSED_POTENTIAL_KEYS } from '../../shared/file-quantities.ts';
import { parseInteractionModel, resolvePairsFor, MissingPairError, type InteractionModel, type ResolvedPair } from '../../shared/interaction-model.ts';
import type { AppContext } from '../context.ts';
import { projects, trajectories, type TrajectoryRow } from '../db/schema/index.ts';
import { AppError, badRequest, notFound } from '../errors.ts';
import { getTrajectoryRow, touchProject } from './trajectories.ts';

export interface InteractionModelView {
  /** The model that applies, or null. */
  model: InteractionModel | null;
  /** Where it is stored: on this trajectory, on its project, or nowhere. */
  source: 'trajectory' | 'project' | null;
  /** Every species pair of the trajectory resolved (mixing stated), when a model applies. */
  pairs: ResolvedPair[];
  /** Why the model does not cover this trajectory's species, when it does not. */
  problem: string | null;
}

/** Validates a model from a request; every problem names its field. */
export function checkedModel(input: unknown): InteractionModel {
  const parsed = parseInteractionModel(input);
  if (!parsed.ok) {
    throw new AppError(400, 'invalid_input', `The interaction model is not valid: ${parsed.issues.join('; ')}`, parsed.issues.map((m) => {
      const colon = m.indexOf(': ');
      return { field: m.slice(0, colon), message: m.slice(colon + 2) };
    }));
  }
  return parsed.model;
}

export async function projectModel(ctx: AppContext, projectId: number): Promise<InteractionModel | null> {
  const [row] = await ctx.db.select({ model: projects.interactionModel }).from(projects).where(eq(projects.id, projectId));
  if (!row) throw notFound('Project');
  return row.model ?? null;
}

/** The model for a trajectory: its own, else its project's. */
export async function effectiveModel(ctx: AppContext, row: TrajectoryRow): Promise<{ model: InteractionModel | null; source: InteractionModelView['source'] }> {
  if (row.interactionModel) return { model: row.interactionModel, source: 'trajectory' };
  const shared = await projectModel(ctx, row.projectId);
  return shared ? { model: shared, source: 'project' } : { model: null, source: null };
}

export async function trajectoryModelView(ctx: AppContext, trajectoryId: number): Promise<InteractionModelView> {
  const row = await getTrajectoryRow(ctx, trajectoryId);
  const { model, source } = await effectiveModel(ctx, row);
  if (!model) return { model: null, source: null, pairs: [], problem: null };
  const species = Object.keys(row.speciesCounts ?? {});
  try {
    return { model, source, pairs: species.length ? resolvePairsFor(model, species) : [], problem: null };
  } catch (err) {
    if (err instanceof MissingPairError) return { model, source, pairs: [], problem: err.message };
    throw err;
  }
}

export async function setTrajectoryModel(ctx: AppContext, trajectoryId: number, input: unknown | null): Promise<InteractionModelView> {
  const row = await getTrajectoryRow(ctx, trajectoryId);
  const model = input === null ? null : checkedModel(input);
  await ctx.db.update(trajectories).set({ interactionModel: model, updatedAt: new Date() }).where(eq(trajectories.id, trajectoryId));
  await touchProject(ctx, row.projectId);
  return trajectoryModelView(ctx, trajectoryId);
}

export async function setProjectModel(ctx: AppContext, projectId: number, input: unknown | null): Promise<{ model: InteractionModel | null }> {
  const model = input === null ? null : checkedModel(input);
  const [result] = await ctx.db.update(projects).set({ interactionModel: model }).where(eq(projects.id, projectId));
  if (result.affectedRows !== 1) throw notFound('Project');
  await touchProject(ctx, projectId);
  return { model };
}

/**
 * What an energy analysis of this trajectory will use, filled into the run's
 * parameters at queue time so the report records exactly that: the stored
 * model, the file-key mapping and the ensemble, unless the request gave them.
 * Refuses a run that has neither a model nor file energies.
 */
export async function energyInputs(ctx: AppContext, row: TrajectoryRow, given: { interactionModel?: unknown; fileQuantities?: unknown; ensemble?: unknown }) {
  const filled: Record<string, unknown> = {};
  const model = given.interactionModel ?? (await effectiveModel(ctx, row)).model;
  if (model && given.interactionModel === undefined) filled.interactionModel = model;
  const quantities = (given.fileQuantities ?? row.fileQuantities ?? undefined) as { potentialEnergy?: unknown; totalEnergy?: unknown } | undefined;
  if (quantities && given.fileQuantities === undefined) filled.fileQuantities = quantities;
  if (given.ensemble === undefined && row.ensemble) filled.ensemble = row.ensemble;
  const fileEnergy = Boolean(quantities?.potentialEnergy || quantities?.totalEnergy) || (row.fileValues ?? []).some((k) => (GUESSED_POTENTIAL_KEYS as readonly string[]).includes(k));
  if (!model && !fileEnergy) {
    throw badRequest(`${row.name} has no interaction model and its file states no energies: give the trajectory or its project an interaction model, or map a file key to potential or total energy in its metadata.`);
  }
  if (model) {
    try {
      resolvePairsFor(model as InteractionModel, Object.keys(row.speciesCounts ?? {}));
    } catch (err) {
      if (err instanceof MissingPairError) throw badRequest(`For ${row.name}, ${err.message}.`);
      throw err;
    }
  }
  return filled;
}
