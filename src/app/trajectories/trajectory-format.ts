import type { TrajectoryDto } from '../../../shared/trajectory';

/** "Ar 256, Kr 4" — species with counts, most abundant first. */
export function speciesText(t: Pick<TrajectoryDto, 'speciesCounts'>): string {
  const counts = t.speciesCounts;
  if (!counts) return '';
  return Object.entries(counts).sort((a, b) => b[1] - a[1]).map(([s, n]) => `${s} ${n}`).join(', ');
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

/** Bytes in the binary units people expect for files. */
export function bytesText(bytes: number): string {
  const units = ['B', 'KiB', 'MiB', 'GiB', 'TiB'];
  let v = bytes;
  let u = 0;
  while (v >= 1024 && u < units.length - 1) { v /= 1024; u++; }
  return `${u === 0 ? v : v.toFixed(1)} ${units[u]}`;
}
