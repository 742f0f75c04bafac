import type { Response } from 'express';
import { z } from 'zod';
import type { AppContext } from '../context.ts';
import { getCurveCsv } from '../services/reports.ts';

/** A curve's name as it appears in a CSV path: msd, vacf, vdos… */
export const curveField = z.string().min(1, 'is required').max(64, 'is too long');

/**
 * One curve of a report as a CSV download; members and access-link holders
 * get the same file under the same name.
 */
export async function sendCurveCsv(ctx: AppContext, res: Response, reportId: number, curve: string): Promise<void> {
  const csv = await getCurveCsv(ctx, reportId, curve);
  res.type('text/csv; charset=utf-8');
  res.setHeader('Content-Disposition', `attachment; filename="ergodic-report-${reportId}-${curve.replace(/[^\w-]+/g, '_')}.csv"`);
  res.send(csv);
}
