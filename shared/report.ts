import type { ReportSummary } from './report-summary.ts';

/** A report as the API returns it: what was run, on what, with which result. */
export interface ReportDto {
  id: number;
  projectId: number;
  trajectoryId: number;
  trajectoryName: string;
  runId: number;
  title: string;
  analyses: string[];
  params: Record<string, unknown>;
  /** Headline numbers, one typed block per analysis that ran. */
  summary: ReportSummary;
  /** Methods actually used, per analysis key, plus `caution` and `input` (file, checksum, units). */
  methods: Record<string, unknown>;
  engineVersion: string;
  inputSha256: string | null;
  createdAt: string;
  curves: Record<string, ReportCurve>;
}

export interface ReportCurve {
  columns: string[];
  units: string[];
  /** One array per column; null where a point is undefined. */
  data: (number | null)[][];
}

export interface ReportListItem {
  id: number;
  trajectoryId: number;
  trajectoryName: string;
  title: string;
  analyses: string[];
  createdAt: string;
}
