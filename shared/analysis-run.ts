import { z } from 'zod';
import { analysisKeySchema, analysisParamsSchema } from './analysis-params.ts';

/** Body of POST /api/trajectories/:id/analyses. */
export const startAnalysisSchema = z.object({
  analyses: z.array(analysisKeySchema).min(1, 'pick at least one analysis').max(8),
  params: analysisParamsSchema.default(analysisParamsSchema.parse({})),
}).strict();
export type StartAnalysis = z.input<typeof startAnalysisSchema>;

export const RUN_STATUSES = ['queued', 'running', 'done', 'failed', 'cancelled'] as const;
export type RunStatusName = (typeof RUN_STATUSES)[number];

/** One analysis run (a job) as the API returns it. */
export interface AnalysisRunDto {
  id: number;
  projectId: number;
  trajectoryId: number;
  analyses: string[];
  params: Record<string, unknown>;
  status: RunStatusName;
  progress: number;
  attempts: number;
  error: string | null;
  reportId: number | null;
  requestedBy: { id: number; displayName: string };
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
}
