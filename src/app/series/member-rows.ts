import type { SeriesMemberDto } from '../../../shared/series-api';
import type { SeriesMemberResult, SeriesResults } from '../../../shared/series-results';
import { formatNumber, formatWithError } from '../reports/number-format';
import type { DiffusionUnit } from '../reports/report-units';

/** One row of the members table: the member as the API lists it, its results, and the texts the cells show. */
export interface MemberRow {
  member: SeriesMemberDto;
  result: SeriesMemberResult | null;
  order: number;
  statedT: string;
  measuredT: string;
  density: string;
  pressure: string;
  d: string;
  /** A report to open for this member, when it has one. */
  reportId: number | null;
}

/** Joins the members with their results and words every number with its error. */
export function memberRows(members: readonly SeriesMemberDto[], results: SeriesResults | null, unit: DiffusionUnit): MemberRow[] {
  const byId = new Map((results?.members ?? []).map((m) => [m.trajectoryId, m]));
  return [...members].sort((a, b) => a.position - b.position).map((member, i) => {
    const result = byId.get(member.trajectoryId) ?? null;
    const measured = result?.measuredTemperatureK ?? member.measuredTemperatureK;
    const density = result?.densityGPerCm3 ?? member.densityGPerCm3;
    const pressure = result?.pressureBar ?? member.pressureBar;
    const stated = member.statedTemperatureK ?? result?.statedTemperatureK ?? null;
    return {
      member, result, order: i + 1,
      statedT: stated !== null ? formatNumber(stated, 5) : '—',
      measuredT: measured ? formatWithError(measured.mean, measured.stdError) : '—',
      density: density ? formatWithError(density.mean, density.stdError) : '—',
      pressure: pressure ? `${formatWithError(pressure.value, pressure.stdError)}${pressure.source === 'stated' ? ' (stated)' : ''}` : '—',
      d: result?.d ? formatWithError(result.d[unit], result.dStdError?.[unit]) : result?.motionRegime === 'bounded' ? '0 (bounded)' : '—',
      reportId: member.reportByAnalysis['msd'] ?? member.reportByAnalysis['thermo'] ?? member.reportIds[0] ?? null,
    };
  });
}
