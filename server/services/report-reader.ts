import { eq } from 'drizzle-orm';
import type { Database } from '../db/client.ts';
import { reports, trajectories } from '../db/schema/index.ts';
import { notFound } from '../errors.ts';

/** A report as a reader sees it: everything but storage details. */
export interface ReaderReport {
  id: number;
  title: string;
  analyses: string[];
  params: Record<string, unknown>;
  summary: Record<string, unknown>;
  methods: Record<string, unknown>;
  engineVersion: string;
  inputSha256: string | null;
  createdAt: Date;
  trajectory: { id: number; name: string };
}

export async function getReportForReader(db: Database, reportId: number): Promise<ReaderReport> {
  const [row] = await db.select({ report: reports, trajectoryName: trajectories.name }).from(reports)
    .innerJoin(trajectories, eq(trajectories.id, reports.trajectoryId)).where(eq(reports.id, reportId));
  if (!row) throw notFound('Report');
  const { report } = row;
  return {
    id: report.id, title: report.title, analyses: report.analyses, params: report.params, summary: report.summary,
    methods: report.methods, engineVersion: report.engineVersion, inputSha256: report.inputSha256, createdAt: report.createdAt,
    trajectory: { id: report.trajectoryId, name: row.trajectoryName },
  };
}
