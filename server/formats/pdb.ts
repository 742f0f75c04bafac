/**
 * PDB trajectories: one MODEL … ENDMDL block per frame (or END-separated
 * blocks, or a single model without MODEL records). Coordinates and element
 * come from the fixed columns of ATOM/HETATM records as the wwPDB format
 * description defines them; CRYST1 gives the cell for the frames after it.
 */
import { TrajectoryFormatError, type Cell } from './frame.ts';
import { isBlank, type LineReader } from './line-reader.ts';
import { parseNumberBytes, parseNumberText } from './number-bytes.ts';
import { cellFromParameters } from './cell-parameters.ts';
import type { TextFrame, TextReadContext } from './text-frame.ts';

/** Record name is columns 1–6 (0-based 0..6). */
const RECORD = (buf: Buffer, start: number, end: number): string =>
  buf.toString('latin1', start, Math.min(end, start + 6)).trimEnd().toUpperCase();

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
  let positions: number[] = [];
  let species: string[] = [];
  let frameStart = -1;
  let frameLine: number | undefined;
  let lastSpecies: string[] | null = null;
  let sawAtoms = false;

  const finish = (): TextFrame | null => {
    if (frameStart < 0 || species.length === 0) {
      frameStart = -1;
      return null;
    }
    const n = species.length;
    if (nAtoms >= 0 && n !== nAtoms) {
      throw new TrajectoryFormatError(
        `frame ${index + 1} has ${n} atoms but earlier frames have ${nAtoms}: the atom count must not change`,
        { file, frame: index, line: frameLine },
      );
    }
    nAtoms = n;
    const same = lastSpecies !== null && lastSpecies.every((s, k) => s === species[k]);
    if (!same) lastSpecies = species;
    const frame: TextFrame = {
      index,
      positions: Float64Array.from(positions),
      species: lastSpecies!,
      cell,
      byteOffset: frameStart,
    };
    if (cell) frame.pbc = [true, true, true];
    positions = [];
    species = [];
    frameStart = -1;
    index++;
    return frame;
  };

  try {
    while (await lines.nextLine()) {
      const { buf, start, end } = lines;
      if (isBlank(buf, start, end)) continue;
      const record = RECORD(buf, start, end);
      if (record === 'ATOM' || record === 'HETATM') {
        sawAtoms = true;
        if (frameStart < 0) {
          frameStart = lines.lineOffset;
          frameLine = lines.line;
        }
        if (ctx.wants && !ctx.wants(index)) {
          species.push('');
          continue;
        }
        readAtom(lines, ctx, index, positions, species);
        if (species.length > ctx.limits.maxAtoms) {
          throw new TrajectoryFormatError(`frame has more than the limit of ${ctx.limits.maxAtoms} atoms`, {
            file,
            frame: index,
            line: lines.line,
          });
        }
      } else if (record === 'MODEL') {
        const frame = finish();
        if (frame && (!ctx.wants || ctx.wants(frame.index))) yield frame;
        frameStart = lines.lineOffset;
        frameLine = lines.line;
      } else if (record === 'ENDMDL' || record === 'END') {
        const frame = finish();
        if (frame && (!ctx.wants || ctx.wants(frame.index))) yield frame;
      } else if (record === 'CRYST1') {
        cell = readCryst1(lines, ctx, index);
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

function readAtom(lines: LineReader, ctx: TextReadContext, index: number, positions: number[], species: string[]): void {
  const { buf, start, end } = lines;
  const where = { file: ctx.file, frame: index, line: lines.line };
  if (end - start < Z_COLUMNS[1]) {
    throw new TrajectoryFormatError(
      `ATOM/HETATM record is ${end - start} characters long; coordinates need columns 31–54 (truncated record)`,
      where,
    );
  }
  const axes = ['x', 'y', 'z'];
  [X_COLUMNS, Y_COLUMNS, Z_COLUMNS].forEach((columns, axis) => {
    const [s, e] = field(buf, start, end, columns);
    const value = s < e ? parseNumberBytes(buf, s, e) : NaN;
    if (!Number.isFinite(value)) {
      throw new TrajectoryFormatError(
        `${axes[axis]} in columns ${columns[0] + 1}–${columns[1]} is "${buf.toString('latin1', s, e)}", not a finite number`,
        where,
      );
    }
    positions.push(value);
  });
  species.push(elementOf(buf, start, end, where));
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
