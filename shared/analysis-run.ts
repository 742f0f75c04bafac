import { z } from 'zod';
import { isoDate, personRef, recordId } from './api-fields.ts';
import { ANALYSIS_KEYS, analysisKeySchema, analysisParamsSchema } from './analysis-params.ts';

export const RUN_NOTES_MAX_LENGTH = 2000;

/** Body of POST /api/trajectories/:id/analyses. */
export const startAnalysisSchema = z.object({
  // Every analysis at once is a valid choice (the dialog's checklist can tick them all).
  analyses: z.array(analysisKeySchema).min(1, 'pick at least one analysis').max(ANALYSIS_KEYS.length, 'name each analysis once'),
  params: analysisParamsSchema.default(analysisParamsSchema.parse({})),
  /** Why this run, in the user's words ("longer fit window"); shown with its report. */
  notes: z.string({ error: 'must be text' }).trim().max(RUN_NOTES_MAX_LENGTH, `must be at most ${RUN_NOTES_MAX_LENGTH} characters`).default(''),
}).strict();
export type StartAnalysis = z.input<typeof startAnalysisSchema>;

export const RUN_STATUSES = ['queued', 'running', 'done', 'failed', 'cancelled'] as const;
export type RunStatusName = (typeof RUN_STATUSES)[number];

/** One analysis run (a job) as the API returns it. */
export const analysisRunSchema = z.object({
  id: recordId,
  projectId: recordId,
  trajectoryId: recordId,
  analyses: z.array(z.string()),
  params: z.record(z.string(), z.unknown()),
  notes: z.string(),
  status: z.enum(RUN_STATUSES),
  /** 0–100. */
  progress: z.number(),
  attempts: z.number().int(),
  /** Why it failed or was cancelled, in plain words. */
  error: z.string().nullable(),
  reportId: recordId.nullable(),
  requestedBy: personRef,
  createdAt: isoDate,
  startedAt: isoDate.nullable(),
  finishedAt: isoDate.nullable(),
});
export type AnalysisRunDto = z.infer<typeof analysisRunSchema>;
