/**
 * The comment line of an extended XYZ frame: key=value pairs whose values
 * may be quoted ("..." or '...') or braced ({...}), and bare keys that act
 * as true flags. Keys are matched without regard to case because writers
 * disagree on "Lattice" vs "lattice".
 */
import { TrajectoryFormatError, type Cell } from './frame.ts';
import { parseNumberText } from './number-bytes.ts';
import { COLUMN, type AtomColumns } from './atom-columns.ts';

export interface FrameInfo {
  columns: AtomColumns;
  cell: Cell | null;
  pbc?: [boolean, boolean, boolean];
  time?: number;
  step?: number;
  /** Every other key whose value is one finite number (energy=…, stress components excluded). */
  values?: Record<string, number>;
}

/** Keys with a structural meaning, never reported as per-frame values. */
const STRUCTURAL_KEYS = new Set(['lattice', 'properties', 'pbc', 'time', 'step']);
const SINGLE_NUMBER = /^\s*[+-]?(\d+\.?\d*|\.\d+)([eEdD][+-]?\d+)?\s*$/;

export interface Where {
  file: string;
  frame: number;
  line?: number;
}

const SPECIES_NAMES = new Set(['species', 'element', 'elements', 'symbol', 'symbols']);
const POSITION_NAMES = new Set(['pos', 'position', 'positions']);
const VELOCITY_NAMES = new Set(['velo', 'vel', 'velocity', 'velocities']);
const PROPERTY_TYPES = new Set(['S', 'R', 'I', 'L']);

/** Splits a comment into lowercase key → raw value. */
export function parseKeyValues(text: string, where: Where): Map<string, string> {
  const out = new Map<string, string>();
  let i = 0;
  const n = text.length;
  const isSpace = (c: string) => c === ' ' || c === '\t' || c === '\r' || c === '\n';
  const readToken = (stopAtEquals: boolean): string => {
    const open = text[i];
    if (open === '"' || open === "'" || open === '{' || open === '[') {
      const close = open === '{' ? '}' : open === '[' ? ']' : open;
      i++;
      // Without escapes inside, the value is one slice.
      const closeAt = text.indexOf(close, i);
      if (closeAt >= 0 && !text.slice(i, closeAt).includes('\\')) {
        const value = text.slice(i, closeAt);
        i = closeAt + 1;
        return value;
      }
      let value = '';
      while (i < n && text[i] !== close) {
        if (text[i] === '\\' && i + 1 < n) i++;
        value += text[i++];
      }
      if (i >= n) {
        throw new TrajectoryFormatError(`comment line has an unclosed ${open}`, where);
      }
      i++;
      return value;
    }
    const from = i;
    while (i < n && !isSpace(text[i]) && !(stopAtEquals && text[i] === '=')) i++;
    return text.slice(from, i);
  };
  while (i < n) {
    while (i < n && isSpace(text[i])) i++;
    if (i >= n) break;
    const key = readToken(true);
    let j = i;
    while (j < n && isSpace(text[j])) j++;
    if (text[j] === '=') {
      i = j + 1;
      while (i < n && isSpace(text[i])) i++;
      out.set(key.toLowerCase(), i < n ? readToken(false) : '');
    } else {
      if (key === '') i++;
      else out.set(key.toLowerCase(), 'T');
    }
  }
  return out;
}

/**
 * The last Properties= and Lattice= values one reader met and what they
 * meant: consecutive frames usually repeat both word for word, so most
 * frames skip parsing them. The cell is copied out, as each frame owns its own.
 */
export interface CommentMemo {
  properties?: { text: string; columns: AtomColumns };
  lattice?: { text: string; cell: Cell };
}

/** Reads the per-frame facts an extended XYZ comment line carries. */
export function parseExtxyzComment(text: string, where: Where, memo: CommentMemo = {}): FrameInfo {
  const pairs = parseKeyValues(text, where);
  const properties = pairs.get('properties');
  let columns = DEFAULT_COLUMNS;
  if (properties !== undefined) {
    if (memo.properties?.text !== properties) memo.properties = { text: properties, columns: parseProperties(properties, where) };
    columns = memo.properties.columns;
  }
  const lattice = pairs.get('lattice');
  let cell: Cell | null = null;
  if (lattice !== undefined) {
    if (memo.lattice?.text !== lattice) memo.lattice = { text: lattice, cell: parseLattice(lattice, where) };
    cell = memo.lattice.cell.slice();
  }
  const pbcText = pairs.get('pbc');
  const pbc = pbcText !== undefined ? parsePbc(pbcText, where) : cell ? ([true, true, true] as [boolean, boolean, boolean]) : undefined;
  const info: FrameInfo = { columns, cell, pbc };
  const time = pairs.get('time');
  if (time !== undefined) {
    const value = parseNumberText(time.trim());
    if (!Number.isFinite(value)) throw new TrajectoryFormatError(`Time="${time}" is not a finite number`, where);
    info.time = value;
  }
  const step = pairs.get('step');
  if (step !== undefined && /^\s*[+-]?\d+\s*$/.test(step)) info.step = Number(step);
  for (const [key, raw] of pairs) {
    if (STRUCTURAL_KEYS.has(key) || !SINGLE_NUMBER.test(raw)) continue;
    const value = parseNumberText(raw.trim());
    if (Number.isFinite(value)) (info.values ??= {})[key] = value;
  }
  return info;
}

export const DEFAULT_COLUMNS: AtomColumns = {
  roles: Int8Array.from([COLUMN.species, COLUMN.x, COLUMN.y, COLUMN.z]),
  hasVelocities: false,
  description: 'species x y z',
};

function parseProperties(value: string, where: Where): AtomColumns {
  const parts = value.split(':');
  if (parts.length % 3 !== 0 || parts.length === 0) {
    throw new TrajectoryFormatError(`Properties="${value}" is not a list of name:type:count triples`, where);
  }
  const roles: number[] = [];
  let species = -1;
  let position = -1;
  let velocity = -1;
  const names: string[] = [];
  for (let k = 0; k < parts.length; k += 3) {
    const name = parts[k];
    const type = parts[k + 1].toUpperCase();
    const count = Number(parts[k + 2]);
    if (!PROPERTY_TYPES.has(type) || !Number.isInteger(count) || count < 1) {
      throw new TrajectoryFormatError(`Properties= entry "${parts.slice(k, k + 3).join(':')}" is not name:type:count`, where);
    }
    const lower = name.toLowerCase();
    const first = roles.length;
    for (let c = 0; c < count; c++) roles.push(COLUMN.skip);
    names.push(`${name}${count > 1 ? `×${count}` : ''}`);
    if (species < 0 && SPECIES_NAMES.has(lower) && type === 'S' && count === 1) {
      species = first;
      roles[first] = COLUMN.species;
    } else if (position < 0 && POSITION_NAMES.has(lower) && type === 'R' && count === 3) {
      position = first;
      roles[first] = COLUMN.x;
      roles[first + 1] = COLUMN.y;
      roles[first + 2] = COLUMN.z;
    } else if (velocity < 0 && VELOCITY_NAMES.has(lower) && type === 'R' && count === 3) {
      velocity = first;
      roles[first] = COLUMN.vx;
      roles[first + 1] = COLUMN.vy;
      roles[first + 2] = COLUMN.vz;
    }
  }
  if (position < 0) throw new TrajectoryFormatError(`Properties="${value}" has no positions column (pos:R:3)`, where);
  if (species < 0) throw new TrajectoryFormatError(`Properties="${value}" has no species column (species:S:1)`, where);
  let last = roles.length - 1;
  while (roles[last] === COLUMN.skip) last--;
  return {
    roles: Int8Array.from(roles.slice(0, last + 1)),
    hasVelocities: velocity >= 0,
    description: names.join(' '),
  };
}

function parseLattice(value: string, where: Where): Cell {
  const parts = value.replace(/[[\](),]/g, ' ').trim().split(/\s+/).filter(Boolean);
  const numbers = parts.map(parseNumberText);
  if (numbers.length !== 9 || numbers.some((x) => !Number.isFinite(x))) {
    throw new TrajectoryFormatError(
      `Lattice="${value}" must hold 9 finite numbers (three lattice vectors), found ${parts.length} values`,
      where,
    );
  }
  return Float64Array.from(numbers);
}

function parsePbc(value: string, where: Where): [boolean, boolean, boolean] {
  const parts = value.trim().split(/[\s,]+/).filter(Boolean);
  const flags = parts.map((p) => {
    const lower = p.toLowerCase();
    if (lower === 't' || lower === 'true' || lower === '1') return true;
    if (lower === 'f' || lower === 'false' || lower === '0') return false;
    return undefined;
  });
  if (flags.length === 1 && flags[0] !== undefined) return [flags[0], flags[0], flags[0]];
  if (flags.length !== 3 || flags.some((f) => f === undefined)) {
    throw new TrajectoryFormatError(`pbc="${value}" must be three of T/F`, where);
  }
  return flags as [boolean, boolean, boolean];
}
