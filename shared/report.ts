import { z } from 'zod';
import { isoDate, recordId } from './api-fields.ts';
import { keyNumbersSchema } from './report-key-numbers.ts';
import type { ReportSummary } from './report-summary.ts';

export const reportCurveSchema = z.object({
  columns: z.array(z.string()),
  units: z.array(z.string()),
  /** One array per column; null where a point is undefined. */
  data: z.array(z.array(z.number().nullable())),
});
export type ReportCurve = z.infer<typeof reportCurveSchema>;

const isObject = (v: unknown) => typeof v === 'object' && v !== null && !Array.isArray(v);

/** A report as the API returns it: what was run, on what, with which result. */
export const reportSchema = z.object({
  id: recordId,
  projectId: recordId,
  trajectoryId: recordId,
  trajectoryName: z.string(),
  runId: recordId,
  title: z.string(),
  /** The notes the run was started with. */
  notes: z.string(),
  analyses: z.array(z.string()),
  params: z.record(z.string(), z.unknown()),
  /** Headline numbers, one typed block per analysis that ran. */
  summary: z.custom<ReportSummary>(isObject)
    .meta({ description: 'Headline numbers, one block per analysis that ran (typed in shared/report-summary.ts); every field names its unit.' }),
  /** Methods actually used, per analysis key, plus `caution` and `input` (file, checksum, units). */
  methods: z.record(z.string(), z.unknown()),
  engineVersion: z.string(),
  inputSha256: z.string().nullable(),
  createdAt: isoDate,
  curves: z.record(z.string(), reportCurveSchema),
});
export type ReportDto = z.infer<typeof reportSchema>;

export const reportListItemSchema = z.object({
  id: recordId,
  trajectoryId: recordId,
  trajectoryName: z.string(),
  title: z.string(),
  notes: z.string(),
  analyses: z.array(z.string()),
  /** D, T, peaks: what tells this report apart from others of the same system. */
  keyNumbers: keyNumbersSchema,
  createdAt: isoDate,
});
export type ReportListItem = z.infer<typeof reportListItemSchema>;

/** GET /api/links/:token: the shared report and when the link stops working. */
export const linkedReportSchema = z.object({ expiresAt: isoDate, report: reportSchema });
export type LinkedReport = z.infer<typeof linkedReportSchema>;
