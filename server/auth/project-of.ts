import { eq } from 'drizzle-orm';
import type { Database } from '../db/client.ts';
import { analysisRuns, reports, series, trajectories } from '../db/schema/index.ts';
import type { ResourceKind } from '../routes/route-table.ts';

/** The project a resource belongs to, or null when the resource does not exist. */
export async function projectOf(db: Database, kind: ResourceKind, id: number): Promise<number | null> {
  switch (kind) {
    case 'project':
      return id;
    case 'trajectory': {
      const [row] = await db.select({ p: trajectories.projectId }).from(trajectories).where(eq(trajectories.id, id));
      return row?.p ?? null;
    }
    case 'report': {
      const [row] = await db.select({ p: reports.projectId }).from(reports).where(eq(reports.id, id));
      return row?.p ?? null;
    }
    case 'job': {
      const [row] = await db.select({ p: analysisRuns.projectId }).from(analysisRuns).where(eq(analysisRuns.id, id));
      return row?.p ?? null;
    }
    case 'series': {
      const [row] = await db.select({ p: series.projectId }).from(series).where(eq(series.id, id));
      return row?.p ?? null;
    }
  }
}
