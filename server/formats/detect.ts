/**
 * Format and compression from content. File names lie (".txt", no
 * extension, ".xyz" that is really extended XYZ), so the name only breaks
 * ties between formats the content cannot tell apart.
 */
import { TrajectoryFormatError, type Compression, type TrajectoryFormat } from './frame.ts';

const GZIP_MAGIC = [0x1f, 0x8b];
const ZIP_MAGIC = [0x50, 0x4b, 0x03, 0x04];
const EMPTY_ZIP_MAGIC = [0x50, 0x4b, 0x05, 0x06];
const HDF5_MAGIC = [0x89, 0x48, 0x44, 0x46, 0x0d, 0x0a, 0x1a, 0x0a];
/** HDF5 allows a user block before the superblock, at 512, 1024, 2048 … bytes. */
const HDF5_SUPERBLOCK_OFFSETS = [0, 512, 1024, 2048, 4096, 8192];

/** Bytes to peek before deciding; enough for a PDB header or an XYZ header plus comment line. */
export const DETECT_BYTES = 64 * 1024;

const PDB_RECORDS = new Set([
  'HEADER', 'TITLE', 'COMPND', 'SOURCE', 'KEYWDS', 'EXPDTA', 'AUTHOR', 'REVDAT', 'REMARK', 'CRYST1',
  'ORIGX1', 'ORIGX2', 'ORIGX3', 'SCALE1', 'SCALE2', 'SCALE3', 'MODEL', 'ATOM', 'HETATM', 'TER', 'SEQRES',
  'HELIX', 'SHEET', 'CONECT', 'MASTER', 'END', 'ENDMDL', 'ANISOU', 'JRNL', 'NUMMDL', 'MDLTYP',
]);

const EXTXYZ_KEYS = /(^|\s)(lattice|properties|pbc|time)\s*=/i;

function startsWith(head: Uint8Array, magic: number[], at = 0): boolean {
  if (head.length < at + magic.length) return false;
  return magic.every((byte, k) => head[at + k] === byte);
}

export function detectCompression(head: Uint8Array): Compression {
  if (startsWith(head, GZIP_MAGIC)) return 'gzip';
  if (startsWith(head, ZIP_MAGIC) || startsWith(head, EMPTY_ZIP_MAGIC)) return 'zip';
  return 'none';
}

export function isHdf5(head: Uint8Array): boolean {
  return HDF5_SUPERBLOCK_OFFSETS.some((offset) => startsWith(head, HDF5_MAGIC, offset));
}

/**
 * Decides the format of decompressed content from its first bytes.
 * `complete` says the head is the whole file (so a short head is not a truncated peek).
 */
export function detectFormat(head: Uint8Array, file: string): TrajectoryFormat {
  if (head.length === 0) throw new TrajectoryFormatError('file is empty', { file });
  if (isHdf5(head)) return 'h5md';
  refuseBinary(head, file);
  // Only the first non-blank line and the one after it decide, so the text is
  // cut after the first newline past DETECT_BYTES (a head may be a whole 1 MB
  // chunk), unless that cut leaves those two lines incomplete.
  const cut = head.length > DETECT_BYTES ? head.indexOf(10, DETECT_BYTES) : -1;
  let lines = textLines(cut >= 0 ? head.subarray(0, cut) : head);
  let firstIndex = lines.findIndex((line) => line.trim() !== '');
  if (cut >= 0 && (firstIndex < 0 || firstIndex + 1 >= lines.length)) {
    lines = textLines(head);
    firstIndex = lines.findIndex((line) => line.trim() !== '');
  }
  if (firstIndex < 0) throw new TrajectoryFormatError('file holds only blank lines, no frames', { file });
  const first = lines[firstIndex];
  if (/^\s*\d+\s*$/.test(first)) {
    const comment = lines[firstIndex + 1] ?? '';
    return EXTXYZ_KEYS.test(comment) ? 'extxyz' : 'xyz';
  }
  const record = first.slice(0, 6).trim().toUpperCase();
  if (PDB_RECORDS.has(record)) return 'pdb';
  const hint = formatFromName(file);
  const shown = first.length > 60 ? `${first.slice(0, 60)}…` : first;
  throw new TrajectoryFormatError(
    `not a recognised trajectory: expected XYZ (an atom count on line ${firstIndex + 1}), PDB records or HDF5, found "${shown}"` +
      (hint ? ` (the name suggests ${hint})` : ''),
    { file, line: firstIndex + 1 },
  );
}

/** Refuses binary content early with a clear message instead of a confusing parse error. */
function refuseBinary(head: Uint8Array, file: string): void {
  let control = 0;
  for (let i = 0; i < head.length; i++) {
    const c = head[i];
    if (c === 0) throw new TrajectoryFormatError(`binary data (NUL byte at offset ${i}), not a text trajectory`, { file });
    if (c < 32 && c !== 9 && c !== 10 && c !== 13 && c !== 12) control++;
  }
  if (control > head.length / 100 + 1) {
    throw new TrajectoryFormatError('binary data (control bytes in the text), not a text trajectory', { file });
  }
}

function textLines(bytes: Uint8Array): string[] {
  const text = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength).toString('utf8');
  return text.split('\n').map((line) => line.replace(/\r$/, ''));
}

/** The format a file name suggests, used only in messages and tie-breaks. */
export function formatFromName(name: string): TrajectoryFormat | undefined {
  const lower = name.toLowerCase().replace(/\.(gz|zip)$/, '');
  if (/\.(extxyz|exyz)$/.test(lower)) return 'extxyz';
  if (lower.endsWith('.xyz')) return 'xyz';
  if (/\.(pdb|ent)$/.test(lower)) return 'pdb';
  if (/\.(h5md|h5|hdf5)$/.test(lower)) return 'h5md';
  return undefined;
}
