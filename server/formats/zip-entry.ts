/**
 * Which zip entries count as the trajectory, and which names are refused.
 * Archivers add directory entries and macOS resource forks; those are
 * skipped. Names that could escape a directory are refused outright even
 * though nothing is extracted to disk by name, because such an archive is
 * either broken or hostile.
 */
import { TrajectoryFormatError } from './frame.ts';

export function checkEntryName(name: string, file: string): void {
  const problem = name.includes('\0')
    ? 'contains a NUL byte'
    : name.includes('\\')
      ? 'contains a backslash'
      : name.startsWith('/') || /^[A-Za-z]:/.test(name)
        ? 'is an absolute path'
        : name.split('/').some((part) => part === '..')
          ? 'climbs out of the archive with ".."'
          : null;
  if (problem) {
    throw new TrajectoryFormatError(`zip entry name "${name.replace(/\0/g, '\\0')}" ${problem}; the archive is refused`, { file });
  }
}

/** True for entries that are archive bookkeeping rather than content. */
export function isIgnoredEntry(name: string): boolean {
  const base = name.split('/').pop() ?? '';
  return (
    name.endsWith('/') ||
    name.startsWith('__MACOSX/') ||
    base.startsWith('._') ||
    base === '.DS_Store' ||
    base === 'Thumbs.db'
  );
}
