import type { LinkedReport, ReportDto } from '../../../shared/report';
import { isRecord } from './record-read';

const SHAPE_ERROR = 'The report came back in a shape this page cannot read.';

/** Checks the parts of a report the page relies on before trusting the rest of its shape. */
export function parseReport(raw: unknown): ReportDto {
  const ok = isRecord(raw) && typeof raw['id'] === 'number' && typeof raw['projectId'] === 'number' && typeof raw['title'] === 'string' && typeof raw['notes'] === 'string'
    && typeof raw['trajectoryName'] === 'string' && typeof raw['engineVersion'] === 'string' && typeof raw['createdAt'] === 'string'
    && Array.isArray(raw['analyses']) && isRecord(raw['summary']) && isRecord(raw['methods']) && isRecord(raw['params']) && isRecord(raw['curves'])
    && Object.values(raw['curves']).every((c) => isRecord(c) && Array.isArray(c['columns']) && Array.isArray(c['units']) && Array.isArray(c['data']));
  if (!ok) throw new Error(SHAPE_ERROR);
  return raw as unknown as ReportDto;
}

/** The `link` of GET /api/links/:token: the report and when the link stops working. */
export function parseLinkedReport(raw: unknown): LinkedReport {
  if (!isRecord(raw) || typeof raw['expiresAt'] !== 'string') throw new Error(SHAPE_ERROR);
  return { report: parseReport(raw['report']), expiresAt: raw['expiresAt'] };
}
