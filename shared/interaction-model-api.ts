/** Request and answer shapes of the interaction-model routes. */
import { z } from 'zod';
import { interactionModelSchema } from './interaction-model.ts';

export const putInteractionModelSchema = z.object({
  model: z.unknown().refine((m) => m !== undefined && m !== null, 'is required (send {"model": {...}}, or DELETE to remove it)'),
});

export const trajectoryModelViewSchema = z.object({
  model: interactionModelSchema.nullable(),
  source: z.enum(['trajectory', 'project']).nullable(),
  /** Every species pair of the trajectory in eV and Å, with origin "given" or "mixed". */
  pairs: z.array(z.record(z.string(), z.unknown())),
  problem: z.string().nullable(),
});
export type TrajectoryModelView = z.infer<typeof trajectoryModelViewSchema>;

export const projectModelSchema = z.object({ model: interactionModelSchema.nullable() });

export const interactionPresetSchema = z.object({
  id: z.string(),
  name: z.string(),
  description: z.string(),
  source: z.string(),
  sourceStatus: z.enum(['confirmed', 'from memory']),
  model: z.record(z.string(), z.unknown()),
});
