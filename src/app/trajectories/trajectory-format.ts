import type { TrajectoryDto } from '../../../shared/trajectory';

/** "Ar 256, Kr 4" — species with counts, most abundant first. */
export function speciesText(t: Pick<TrajectoryDto, 'speciesCounts'>): string {
  const counts = t.speciesCounts;
  if (!counts) return '';
  return Object.entries(counts).sort((a, b) => b[1] - a[1]).map(([s, n]) => `${s} ${n}`).join(', ');
}

/**
 * Every element inspection assumed, and every species it could not name, in
 * one line ("CA taken as C, NE as N; no element for bead"), or '' when every
 * label is an exact symbol or confirmed.
 */
export function assumedElementsText(t: Pick<TrajectoryDto, 'speciesElements'>): string {
  const entries = Object.entries(t.speciesElements ?? {});
  const assumed = entries.filter(([, e]) => e.status === 'assumed').map(([label, e], i) => `${label}${i === 0 ? ' taken' : ''} as ${e.element}`);
  const unknown = entries.filter(([, e]) => e.status === 'unknown').map(([label]) => label);
  return [assumed.join(', '), unknown.length ? `no element for ${unknown.join(', ')}` : ''].filter(Boolean).join('; ');
}

export function formatText(t: Pick<TrajectoryDto, 'format' | 'compression'>): string {
  if (!t.format) return '';
  const names: Record<string, string> = { xyz: 'XYZ', extxyz: 'Extended XYZ', pdb: 'PDB', h5md: 'H5MD' };
  const base = names[t.format] ?? t.format;
  return t.compression && t.compression !== 'none' ? `${base} (${t.compression})` : base;
}

/** Text a filter box matches against: every column a person might type. */
export function filterText(t: TrajectoryDto): string {
  return [t.name, formatText(t), speciesText(t), t.ensemble ?? '', t.status, t.uploadedBy.displayName, t.potential, t.engine, t.notes]
    .join(' ').toLowerCase();
}

/**
 * A file name in pieces that may break after "-", "_" or ".", so a long name
 * wraps at its own separators instead of in the middle of a word.
 */
export function nameParts(name: string): string[] {
  return name.split(/(?<=[-_.])/);
}
