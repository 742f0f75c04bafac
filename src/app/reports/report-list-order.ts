import type { ReportListItem } from '../../../shared/report';
import { analysesText } from '../../../shared/analysis-labels';
import { formatNumber, formatWithError } from './number-format';

export type ReportOrder = 'newest' | 'oldest' | 'title' | 'diffusion' | 'temperature';

export const REPORT_ORDERS: readonly { key: ReportOrder; label: string }[] = [
  { key: 'newest', label: 'Newest first' },
  { key: 'oldest', label: 'Oldest first' },
  { key: 'title', label: 'Title, A to Z' },
  { key: 'diffusion', label: 'D, highest first' },
  { key: 'temperature', label: 'T, highest first' },
];

/** The words a filter matches: title, file, notes, analyses and the key numbers as shown. */
function searchableText(r: ReportListItem): string {
  return [r.title, r.trajectoryName, r.notes, analysesText(r.analyses), ...keyNumberTexts(r)].join(' ').toLowerCase();
}

const byNumberDescending = (value: (r: ReportListItem) => number | null | undefined) => (a: ReportListItem, b: ReportListItem) => {
  const x = value(a);
  const y = value(b);
  // Reports without the number go last, in their usual order.
  if (x === null || x === undefined) return y === null || y === undefined ? b.id - a.id : 1;
  if (y === null || y === undefined) return -1;
  return y - x;
};

const ORDERINGS: Record<ReportOrder, (a: ReportListItem, b: ReportListItem) => number> = {
  newest: (a, b) => b.createdAt.localeCompare(a.createdAt) || b.id - a.id,
  oldest: (a, b) => a.createdAt.localeCompare(b.createdAt) || a.id - b.id,
  title: (a, b) => a.title.localeCompare(b.title, undefined, { numeric: true, sensitivity: 'base' }),
  diffusion: byNumberDescending((r) => r.keyNumbers.diffusion?.e9M2PerS),
  temperature: byNumberDescending((r) => r.keyNumbers.temperatureK?.mean),
};

/** Reports whose text holds every word of the filter, in the chosen order. */
export function filterAndOrder(reports: readonly ReportListItem[], filter: string, order: ReportOrder): ReportListItem[] {
  const words = filter.toLowerCase().split(/\s+/).filter(Boolean);
  return reports.filter((r) => {
    const text = searchableText(r);
    return words.every((w) => text.includes(w));
  }).sort(ORDERINGS[order]);
}

/** "D = 1.50 ± 0.10 × 10⁻⁹ m²/s", "T = 300 ± 2 K", "VDOS peaks 120, 480 cm⁻¹", "g(r) peak at 3.8 Å". */
export function keyNumberTexts(r: ReportListItem): string[] {
  const k = r.keyNumbers;
  const texts: string[] = [];
  if (k.diffusion) {
    const value = k.diffusion.stdError === null ? formatNumber(k.diffusion.e9M2PerS, 3) : formatWithError(k.diffusion.e9M2PerS, k.diffusion.stdError);
    texts.push(`D = ${value} × 10⁻⁹ m²/s (${k.diffusion.method})`);
  }
  if (k.temperatureK) texts.push(`T = ${formatWithError(k.temperatureK.mean, k.temperatureK.stdError)} K`);
  if (k.vdosPeaksCm1.length) texts.push(`VDOS peak${k.vdosPeaksCm1.length > 1 ? 's' : ''} ${k.vdosPeaksCm1.map((p) => formatNumber(p, 4)).join(', ')} cm⁻¹`);
  if (k.rdfFirstPeakA !== null) texts.push(`g(r) peak at ${formatNumber(k.rdfFirstPeakA, 3)} Å`);
  return texts;
}
