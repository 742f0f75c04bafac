/** The members table of a series as CSV: one row per member, units in the header, empty cells where a number is missing. */
import type { SeriesDto } from '../../../shared/series-api.ts';

const COLUMNS = [
  'position', 'trajectory id', 'trajectory', 'branch', 'excluded from fits', 'stated temperature (K)', 'measured temperature (K)', 'measured temperature error (K)',
  'temperature used (K)', 'D (Å²/ps)', 'D error (Å²/ps)', 'D (cm²/s)', 'Lindemann ratio', 'density (g/cm³)', 'pressure (bar)', 'energy per atom (eV)',
  'energy per atom error (eV)', 'energy kind', 'Cv fluctuation (kB/atom)', 'Cv harmonic VDOS (kB/atom)', 'phase', 'phase reason', 'status',
] as const;

const cell = (v: unknown): string => {
  if (v === null || v === undefined) return '';
  const s = String(v);
  return /[",\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
};

export function seriesTableCsv(s: SeriesDto): string {
  const resultOf = new Map((s.results?.members ?? []).map((m) => [m.trajectoryId, m]));
  const lines = [COLUMNS.map(cell).join(',')];
  for (const m of s.members) {
    const r = resultOf.get(m.trajectoryId);
    lines.push([
      m.position, m.trajectoryId, m.trajectoryName, m.branch, m.excludedFromFit, m.statedTemperatureK, m.measuredTemperatureK?.mean, m.measuredTemperatureK?.stdError,
      r?.temperatureK, r?.d?.a2PerPs, r?.dStdError?.a2PerPs, r?.d?.cm2PerS, r?.lindemannRatio, m.densityGPerCm3?.mean, m.pressureBar?.value,
      r?.energyPerAtom?.eV, r?.energyPerAtom?.stdError, r?.energyPerAtom?.kind, r?.cvFluctuationPerAtomKB?.value, r?.cvHarmonicPerAtomKB,
      r?.phase.phase, r?.phase.reason, m.status,
    ].map(cell).join(','));
  }
  return lines.join('\n') + '\n';
}
