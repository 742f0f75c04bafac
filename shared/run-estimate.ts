import { z } from 'zod';
import { analysisKeySchema } from './analysis-params.ts';

/** What a run will cost, estimated before it is queued (POST …/analyses/estimate, and the 422 of a refused start). */
export const runEstimateSchema = z.object({
  /** Estimated wall time on one core, s; aims at the right order, within about a factor of two. */
  seconds: z.number(),
  /** Estimated peak memory of the job, bytes; coordinates beyond the site's in-memory budget wait on disk instead. */
  memoryBytes: z.number(),
  /** Disk the job's scratch file takes in the worker's temporary folder, bytes (0 when the coordinates fit in memory). */
  scratchBytes: z.number(),
  analyses: z.array(z.object({ key: analysisKeySchema, seconds: z.number() })),
  /** The frames the analyses will see. */
  frames: z.object({
    from: z.number().int(),
    /** One past the last frame that may be used. */
    to: z.number().int(),
    stride: z.number().int(),
    used: z.number().int(),
    /** Frames left out at the start for equilibration. */
    discarded: z.number().int(),
    /** True when the stride was chosen because the run is long. */
    autoStride: z.boolean(),
  }),
  /** The g(r) range that will be used, Å (null: half the shortest cell width). */
  rMaxA: z.number().nullable(),
  limits: z.object({ seconds: z.number(), memoryBytes: z.number() }),
  withinLimits: z.boolean(),
  /** Ways to bring the run under the limits. */
  advice: z.array(z.string()),
});
export type RunEstimate = z.infer<typeof runEstimateSchema>;
