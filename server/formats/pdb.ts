/**
 * PDB trajectories: one MODEL … ENDMDL block per frame (or END-separated
 * blocks, or a single model without MODEL records). Coordinates and element
 * come from the fixed columns of ATOM/HETATM records as the wwPDB format
 * description defines them; CRYST1 gives the cell for the frames after it.
 */
import { TrajectoryFormatError, type Cell } from './frame.ts';
import { isBlank, type LineReader } from './line-reader.ts';
import { parseNumberText } from './number-bytes.ts';
import { parseColumnNumber } from './column-number.ts';
import { cellFromParameters } from './cell-parameters.ts';
import type { TextFrame, TextReadContext } from './text-frame.ts';

/** Record name is columns 1–6 (0-based 0..6). */
const RECORD = (buf: Buffer, start: number, end: number): string =>
  buf.toString('latin1', start, Math.min(end, start + 6)).trimEnd().toUpperCase();

/**
 * True when the record name (any case, as RECORD reads it) is ATOM or HETATM, read from the bytes without making a string.
 * No closures here or in the other per-line functions: the TypeScript loader names every closure it creates, which costs a property definition each time.
 */
function isAtomRecord(buf: Buffer, start: number, end: number): boolean {
  if (end - start < 4) return false;
  const c0 = buf[start] | 32, c1 = buf[start + 1] | 32, c2 = buf[start + 2] | 32, c3 = buf[start + 3] | 32;
  if (c0 === 97 && c1 === 116 && c2 === 111 && c3 === 109) return isBlank(buf, start + 4, Math.min(end, start + 6)); // atom
  return end - start >= 6 && c0 === 104 && c1 === 101 && c2 === 116 && c3 === 97 && (buf[start + 4] | 32) === 116 && (buf[start + 5] | 32) === 109; // hetatm
}

/** Bytes of the columns an element is read from (atom name 13–16, element 77–78), remembered per atom to reuse its symbol. */
const NAME_BYTES = 6;

/** 1-based inclusive wwPDB columns → 0-based [from, to). */
const X_COLUMNS = [30, 38] as const;
const Y_COLUMNS = [38, 46] as const;
const Z_COLUMNS = [46, 54] as const;
const NAME_COLUMNS = [12, 16] as const;
const ELEMENT_COLUMNS = [76, 78] as const;

export async function* readPdb(lines: LineReader, ctx: TextReadContext): AsyncGenerator<TextFrame> {
  const { file } = ctx;
  let index = ctx.firstIndex;
  let nAtoms = -1;
  let cell: Cell | null = null;
  let positions = new Float64Array(3 * 1024);
  /** Atom lines of the current frame so far. */
  let atoms = 0;
  // The last parsed frame's element columns and symbol of each atom: most frames repeat them.
  let seenNames = new Uint8Array(NAME_BYTES * 1024);
  const seenSpecies: string[] = [];
  /** Set when an atom's symbol differs from the last parsed frame's, so the frame needs a species array of its own. */
  const changed = { species: false };
  let frameStart = -1;
  let frameLine: number | undefined;
  let lastSpecies: string[] | null = null;
  let sawAtoms = false;
  // Whether frame `wantedIndex` is to be parsed, asked once per frame rather than per atom line.
  let wantedIndex = -1;
  let wanted = true;
  const cryst1: Cryst1Memo = { bytes: null, cell: null };

  const finish = (): TextFrame | null => {
    if (frameStart < 0 || atoms === 0) {
      frameStart = -1;
      return null;
    }
    const n = atoms;
    if (nAtoms >= 0 && n !== nAtoms) {
      throw new TrajectoryFormatError(
        `frame ${index + 1} has ${n} atoms but earlier frames have ${nAtoms}: the atom count must not change`,
        { file, frame: index, line: frameLine },
      );
    }
    nAtoms = n;
    if (wanted && (changed.species || lastSpecies === null)) lastSpecies = seenSpecies.slice(0, n);
    changed.species = false;
    const frame: TextFrame = {
      index,
      positions: positions.slice(0, 3 * n),
      species: lastSpecies ?? [],
      cell,
      byteOffset: frameStart,
    };
    if (cell) frame.pbc = [true, true, true];
    atoms = 0;
    frameStart = -1;
    index++;
    return frame;
  };

  try {
    // The synchronous next() serves buffered lines; awaiting only when a chunk runs out keeps a microtask off every line.
    while (lines.next() || (await lines.nextLine())) {
      const { buf, start, end } = lines;
      if (isBlank(buf, start, end)) continue;
      if (isAtomRecord(buf, start, end)) {
        sawAtoms = true;
        if (frameStart < 0) {
          frameStart = lines.lineOffset;
          frameLine = lines.line;
        }
        if (wantedIndex !== index) {
          wantedIndex = index;
          wanted = !ctx.wants || ctx.wants(index);
        }
        const k = atoms++;
        if (!wanted) continue;
        if (3 * k + 3 > positions.length) positions = grown(positions, 2 * positions.length);
        if (NAME_BYTES * (k + 1) > seenNames.length) seenNames = grown(seenNames, 2 * seenNames.length);
        readAtom(lines, ctx, index, positions, 3 * k);
        readSpecies(lines, file, index, seenNames, seenSpecies, k, changed);
        if (atoms > ctx.limits.maxAtoms) {
          throw new TrajectoryFormatError(`frame has more than the limit of ${ctx.limits.maxAtoms} atoms`, {
            file,
            frame: index,
            line: lines.line,
          });
        }
        continue;
      }
      const record = RECORD(buf, start, end);
      if (record === 'MODEL') {
        const frame = finish();
        if (frame && (!ctx.wants || ctx.wants(frame.index))) yield frame;
        frameStart = lines.lineOffset;
        frameLine = lines.line;
      } else if (record === 'ENDMDL' || record === 'END') {
        const frame = finish();
        if (frame && (!ctx.wants || ctx.wants(frame.index))) yield frame;
      } else if (record === 'CRYST1') {
        cell = cryst1Cell(lines, ctx, index, cryst1);
      }
    }
    const frame = finish();
    if (frame && (!ctx.wants || ctx.wants(frame.index))) yield frame;
    if (!sawAtoms && ctx.firstIndex === 0) {
      throw new TrajectoryFormatError('no ATOM or HETATM records: the file holds no coordinates', { file });
    }
  } finally {
    await lines.close();
  }
}

function field(buf: Buffer, start: number, end: number, [from, to]: readonly [number, number]): [number, number] {
  let s = start + from;
  let e = Math.min(end, start + to);
  while (s < e && (buf[s] === 32 || buf[s] === 9)) s++;
  while (e > s && (buf[e - 1] === 32 || buf[e - 1] === 9)) e--;
  return [s, e];
}

/** x, y, z from columns 31–38, 39–46 and 47–54. */
function readAtom(lines: LineReader, ctx: TextReadContext, index: number, positions: Float64Array, at: number): void {
  const { buf, start, end } = lines;
  if (end - start < Z_COLUMNS[1]) {
    throw new TrajectoryFormatError(
      `ATOM/HETATM record is ${end - start} characters long; coordinates need columns 31–54 (truncated record)`,
      { file: ctx.file, frame: index, line: lines.line },
    );
  }
  const x = parseColumnNumber(buf, start + X_COLUMNS[0], start + X_COLUMNS[1]);
  const y = parseColumnNumber(buf, start + Y_COLUMNS[0], start + Y_COLUMNS[1]);
  const z = parseColumnNumber(buf, start + Z_COLUMNS[0], start + Z_COLUMNS[1]);
  // NaN unless all three are finite.
  if (x - x + (y - y) + (z - z) !== 0) throw coordinateError(lines, ctx, index, [x, y, z]);
  positions[at] = x;
  positions[at + 1] = y;
  positions[at + 2] = z;
}

/** Names the first coordinate that is not a finite number; only runs on failure. */
function coordinateError(lines: LineReader, ctx: TextReadContext, index: number, values: number[]): TrajectoryFormatError {
  const axis = values.findIndex((v) => !Number.isFinite(v));
  const columns = [X_COLUMNS, Y_COLUMNS, Z_COLUMNS][axis];
  const [s, e] = field(lines.buf, lines.start, lines.end, columns);
  return new TrajectoryFormatError(
    `${'xyz'[axis]} in columns ${columns[0] + 1}–${columns[1]} is "${lines.buf.toString('latin1', s, e)}", not a finite number`,
    { file: ctx.file, frame: index, line: lines.line },
  );
}

/**
 * Atom k's element into seenSpecies[k]: kept when its name and element columns are byte for byte the last parsed
 * frame's, else read afresh, flagging `changed` when the symbol differs.
 */
function readSpecies(
  lines: LineReader,
  file: string,
  index: number,
  seen: Uint8Array,
  seenSpecies: string[],
  k: number,
  changed: { species: boolean },
): void {
  const { buf, start, end } = lines;
  const at = NAME_BYTES * k;
  let same = seenSpecies[k] !== undefined;
  // The usual case, a full-length record that repeats the last frame's columns, in six plain comparisons.
  const name = start + NAME_COLUMNS[0];
  const element = start + ELEMENT_COLUMNS[0];
  if (
    same &&
    end - start >= ELEMENT_COLUMNS[1] &&
    seen[at] === buf[name] &&
    seen[at + 1] === buf[name + 1] &&
    seen[at + 2] === buf[name + 2] &&
    seen[at + 3] === buf[name + 3] &&
    seen[at + 4] === buf[element] &&
    seen[at + 5] === buf[element + 1]
  ) {
    return;
  }
  for (let j = 0; j < NAME_BYTES; j++) {
    const col = j < 4 ? start + NAME_COLUMNS[0] + j : start + ELEMENT_COLUMNS[0] + j - 4;
    const byte = col < end ? buf[col] : 0;
    if (seen[at + j] !== byte) {
      same = false;
      seen[at + j] = byte;
    }
  }
  if (same) return;
  const symbol = elementOf(buf, start, end, { file, frame: index, line: lines.line });
  if (symbol !== seenSpecies[k]) changed.species = true;
  seenSpecies[k] = symbol;
}

function grown<T extends Float64Array | Uint8Array>(array: T, length: number): T {
  const out = new (array.constructor as { new (n: number): T })(length);
  out.set(array);
  return out;
}

/** Element from columns 77–78, else from the atom name (columns 13–16), as element symbols conventionally sit there. */
function elementOf(buf: Buffer, start: number, end: number, where: { file: string; frame: number; line?: number }): string {
  const [s, e] = field(buf, start, end, ELEMENT_COLUMNS);
  if (s < e) {
    const symbol = buf.toString('latin1', s, e);
    if (/^[A-Za-z]{1,2}$/.test(symbol)) return capitalise(symbol);
  }
  const name = buf.toString('latin1', start + NAME_COLUMNS[0], Math.min(end, start + NAME_COLUMNS[1]));
  const letters = name.replace(/[^A-Za-z]/g, '');
  if (!letters) throw new TrajectoryFormatError('atom has neither an element (columns 77–78) nor an atom name (columns 13–16)', where);
  // A name starting in column 14 (column 13 blank or a digit) is a one-letter element;
  // hydrogen names fill all four columns ("HG12") and must not read as mercury.
  const first = name[0];
  if (first === ' ' || /\d/.test(first) || letters.length === 1) return letters[0].toUpperCase();
  if (name.trimEnd().length === 4 && /^H/i.test(name)) return 'H';
  return capitalise(letters.slice(0, 2));
}

function capitalise(symbol: string): string {
  return symbol[0].toUpperCase() + symbol.slice(1).toLowerCase();
}

/** The last CRYST1 record's bytes and the cell read from them: frames of a run at constant volume repeat it byte for byte. */
interface Cryst1Memo {
  bytes: Buffer | null;
  cell: Cell | null;
}

/** The cell of the current CRYST1 record, read afresh only when the record differs from the last one; each frame gets its own copy. */
function cryst1Cell(lines: LineReader, ctx: TextReadContext, index: number, memo: Cryst1Memo): Cell | null {
  const { buf, start, end } = lines;
  if (memo.bytes === null || buf.compare(memo.bytes, 0, memo.bytes.length, start, end) !== 0) {
    memo.cell = readCryst1(lines, ctx, index);
    memo.bytes = Buffer.from(buf.subarray(start, end));
  }
  return memo.cell && memo.cell.slice();
}

/** CRYST1 a b c α β γ in columns 7–54; the 1 1 1 90 90 90 placeholder means "no cell". */
function readCryst1(lines: LineReader, ctx: TextReadContext, index: number): Cell | null {
  const text = lines.text();
  const where = { file: ctx.file, frame: index, line: lines.line };
  const fixed = [
    [6, 15],
    [15, 24],
    [24, 33],
    [33, 40],
    [40, 47],
    [47, 54],
  ].map(([from, to]) => parseNumberText(text.slice(from, to).trim()));
  const values = fixed.every(Number.isFinite) ? fixed : text.slice(6).trim().split(/\s+/).slice(0, 6).map(parseNumberText);
  if (values.length < 6 || !values.every(Number.isFinite)) {
    throw new TrajectoryFormatError(`CRYST1 record must give a b c α β γ as numbers, found "${text.slice(6, 54).trim()}"`, where);
  }
  const [a, b, c, alpha, beta, gamma] = values;
  if (a === 1 && b === 1 && c === 1 && alpha === 90 && beta === 90 && gamma === 90) return null;
  const cell = cellFromParameters(a, b, c, alpha, beta, gamma);
  if (!cell || !(a > 0 && b > 0 && c > 0)) {
    throw new TrajectoryFormatError(`CRYST1 record describes no valid cell: ${values.join(' ')}`, where);
  }
  return cell;
}
