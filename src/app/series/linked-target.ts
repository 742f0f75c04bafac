import { linkedSeriesSchema, type SeriesDto } from '../../../shared/series-api';
import type { ReportDto } from '../../../shared/report';
import { isRecord } from '../reports/record-read';
import { parseLinkedReport } from '../reports/report-parse';

/** What an access link opens: a report or a series, and when the link stops working. */
export type LinkedTarget = { kind: 'report'; expiresAt: string; report: ReportDto } | { kind: 'series'; expiresAt: string; series: SeriesDto };

/** The `link` of GET /api/links/:token: a series link carries `series`, a report link `report`. */
export function parseLinkedTarget(raw: unknown): LinkedTarget {
  if (isRecord(raw) && 'series' in raw) {
    const parsed = linkedSeriesSchema.safeParse(raw);
    if (!parsed.success) throw new Error(`The shared series came back in a shape this page cannot read (at ${parsed.error.issues[0]?.path.join('.') ?? 'series'}).`);
    return { kind: 'series', ...parsed.data };
  }
  return { kind: 'report', ...parseLinkedReport(raw) };
}
