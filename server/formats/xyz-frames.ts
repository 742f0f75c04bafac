/**
 * The frame loop shared by plain and extended XYZ: an atom-count line, a
 * comment line (which the caller interprets), then one line per atom whose
 * columns are read straight from bytes. Plain XYZ is the special case where
 * the comment is ignored and the columns are species x y z.
 */
import { offerArrays, TrajectoryFormatError, type Cell } from './frame.ts';
import { MIN_ATOM_LINE_BYTES } from './limits.ts';
import { isBlank, type LineReader } from './line-reader.ts';
import { field, parseFieldBytes, parseNumberBytes } from './number-bytes.ts';
import { COLUMN, type AtomColumns } from './atom-columns.ts';
import type { FrameInfo, Where } from './extxyz-comment.ts';
import type { TextFrame, TextReadContext } from './text-frame.ts';

export type CommentReader = (comment: string, where: Where) => FrameInfo;

/** First-frame arrays start this small and grow, so a lying header costs nothing. */
const INITIAL_ATOM_CAPACITY = 1 << 16;

export async function* readXyzFrames(
  lines: LineReader,
  ctx: TextReadContext,
  readComment: CommentReader,
): AsyncGenerator<TextFrame> {
  const { file } = ctx;
  let index = ctx.firstIndex;
  let nAtoms = -1;
  const speciesCache: string[] = [];
  let lastSpecies: string[] | null = null;
  // Refilled frame after frame when the consumer copies each frame at once.
  const spare: { positions: Float64Array | null; velocities: Float64Array | null } = { positions: null, velocities: null };
  const atoms: AtomLoop = { speciesChanged: false };
  try {
    for (;;) {
      let found = false;
      while (await lines.nextLine()) {
        if (!isBlank(lines.buf, lines.start, lines.end)) {
          found = true;
          break;
        }
      }
      if (!found) return;
      const byteOffset = lines.lineOffset;
      const headerLine = lines.line;
      const n = readAtomCount(lines, ctx, index, nAtoms);
      if (!(await lines.nextLine())) {
        throw new TrajectoryFormatError(`file ends after the atom count of frame ${index + 1}: no comment line and no atoms (truncated)`, {
          file,
          frame: index,
          line: headerLine,
        });
      }
      if (ctx.wants && !ctx.wants(index)) {
        for (let a = 0; a < n; a++) {
          if (!lines.next() && !(await lines.nextLine())) throw truncated(file, index, headerLine, n, a);
        }
        nAtoms = n;
        index++;
        continue;
      }
      const info = readComment(lines.text(), { file, frame: index, line: lines.line });
      const { roles, hasVelocities } = info.columns;
      const speciesFirst = isSpeciesFirst(roles, hasVelocities);
      const firstFrame = nAtoms < 0;
      let capacity = firstFrame ? Math.min(n, INITIAL_ATOM_CAPACITY) : n;
      // Every atom line sets x, y, z (and the velocities when the columns have them), so a reused array needs no clearing.
      let positions: Float64Array = spare.positions?.length === 3 * n ? spare.positions : new Float64Array(3 * capacity);
      let velocities: Float64Array | undefined = !hasVelocities ? undefined : spare.velocities?.length === 3 * n ? spare.velocities : new Float64Array(3 * capacity);
      atoms.speciesChanged = lastSpecies === null;
      for (let a = 0; a < n; ) {
        if (a >= capacity) {
          capacity = Math.min(n, capacity * 2);
          positions = grow(positions, 3 * capacity);
          if (velocities) velocities = grow(velocities, 3 * capacity);
        }
        const stop = Math.min(n, capacity);
        const reached = speciesFirst
          ? readSpeciesFirstAtoms(lines, a, stop, positions, velocities, speciesCache, atoms)
          : readBufferedAtoms(lines, a, stop, roles, positions, velocities, speciesCache, atoms);
        if (reached < 0) throw atomLineError(lines, info.columns, index, n, -reached - 1);
        a = reached;
        if (a < stop) {
          // The buffered lines ran out inside the frame.
          if (lines.eof) throw truncated(file, index, headerLine, n, a);
          await lines.more();
        }
      }
      if (atoms.speciesChanged) lastSpecies = speciesCache.slice(0, n);
      const frameVelocities = velocities;
      const recycle = (): void => {
        spare.positions = positions;
        if (frameVelocities) spare.velocities = frameVelocities;
      };
      nAtoms = n;
      const frame: TextFrame = {
        index,
        positions,
        species: lastSpecies!,
        cell: info.cell as Cell | null,
        byteOffset,
      };
      // Refilled next time in any case when the consumer said it copies every frame; else once it hands them back.
      if (ctx.transientFrames) recycle();
      else offerArrays(frame, recycle);
      if (velocities) frame.velocities = velocities;
      if (info.pbc) frame.pbc = info.pbc;
      if (info.time !== undefined) frame.time = info.time;
      if (info.step !== undefined) frame.step = info.step;
      if (info.values) frame.values = info.values;
      yield frame;
      index++;
    }
  } finally {
    await lines.close();
  }
}

/** What the atom-line loop reports besides where it stopped. */
interface AtomLoop {
  /** Set when some atom's species differs from the last frame's. */
  speciesChanged: boolean;
}

/**
 * Parses the atom lines a, a + 1, … before `stop` that are already
 * buffered, and returns the index of the first atom it did not reach
 * (`stop`, or less when the buffer ran out); for a bad line, -(atom + 1)
 * with the reader left on that line. Kept apart from the frame loop so
 * the engine compiles this small, hot function early and on its own.
 */
function readBufferedAtoms(
  lines: LineReader,
  a: number,
  stop: number,
  roles: Int8Array,
  positions: Float64Array,
  velocities: Float64Array | undefined,
  speciesCache: string[],
  loop: AtomLoop,
): number {
  for (; a < stop; a++) {
    if (!lines.next()) return a;
    const buf = lines.buf;
    const end = lines.end;
    let p = lines.start;
    const base = 3 * a;
    for (let col = 0; col < roles.length; col++) {
      let c = buf[p];
      // buf[end] is CR, LF or past the buffer: never a space, so the skip stops there by itself.
      while (c === 32 || c === 9) c = buf[++p];
      if (p >= end) return -a - 1;
      const tokenStart = p;
      const role = roles[col];
      if (role >= COLUMN.x) {
        // Scanned and parsed in one pass.
        const value = parseFieldBytes(buf, tokenStart, end);
        p = field.end;
        if (value - value !== 0) return -a - 1;
        if (role <= COLUMN.z) positions[base + role - COLUMN.x] = value;
        else velocities![base + role - COLUMN.vx] = value;
        continue;
      }
      while (p < end && c !== 32 && c !== 9) c = buf[++p];
      if (role === COLUMN.species) {
        const cached = speciesCache[a];
        let same = cached !== undefined && cached.length === p - tokenStart;
        if (same) {
          for (let k = 0; k < cached.length; k++) {
            if (cached.charCodeAt(k) !== buf[tokenStart + k]) {
              same = false;
              break;
            }
          }
        }
        if (!same) {
          speciesCache[a] = buf.toString('utf8', tokenStart, p);
          loop.speciesChanged = true;
        }
      }
    }
  }
  return a;
}

/** True for the usual columns, species x y z with or without vx vy vz right after: read by the straight-line loop. */
function isSpeciesFirst(roles: Int8Array, hasVelocities: boolean): boolean {
  const want = hasVelocities ? SPECIES_POSITIONS_VELOCITIES : SPECIES_POSITIONS;
  return roles.length === want.length && want.every((role, k) => roles[k] === role);
}

const SPECIES_POSITIONS = [COLUMN.species, COLUMN.x, COLUMN.y, COLUMN.z];
const SPECIES_POSITIONS_VELOCITIES = [...SPECIES_POSITIONS, COLUMN.vx, COLUMN.vy, COLUMN.vz];

/**
 * readBufferedAtoms for species x y z [vx vy vz], the columns nearly every
 * file has, written out column by column: no per-column dispatch on roles.
 * Same results and the same return convention.
 */
function readSpeciesFirstAtoms(
  lines: LineReader,
  a: number,
  stop: number,
  positions: Float64Array,
  velocities: Float64Array | undefined,
  speciesCache: string[],
  loop: AtomLoop,
): number {
  for (; a < stop; a++) {
    if (!lines.next()) return a;
    const buf = lines.buf;
    const end = lines.end;
    let p = lines.start;
    let c = buf[p];
    // buf[end] is CR, LF or past the buffer: never a space, so the skips stop there by themselves.
    while (c === 32 || c === 9) c = buf[++p];
    if (p >= end) return -a - 1;
    const tokenStart = p;
    while (p < end && c !== 32 && c !== 9) c = buf[++p];
    const cached = speciesCache[a];
    let same = cached !== undefined && cached.length === p - tokenStart;
    if (same) {
      for (let k = 0; k < cached.length; k++) {
        if (cached.charCodeAt(k) !== buf[tokenStart + k]) {
          same = false;
          break;
        }
      }
    }
    if (!same) {
      speciesCache[a] = buf.toString('utf8', tokenStart, p);
      loop.speciesChanged = true;
    }
    const base = 3 * a;
    for (let k = 0; k < 3; k++) {
      while (c === 32 || c === 9) c = buf[++p];
      if (p >= end) return -a - 1;
      const value = parseFieldBytes(buf, p, end);
      p = field.end;
      c = buf[p];
      if (value - value !== 0) return -a - 1;
      positions[base + k] = value;
    }
    if (!velocities) continue;
    for (let k = 0; k < 3; k++) {
      while (c === 32 || c === 9) c = buf[++p];
      if (p >= end) return -a - 1;
      const value = parseFieldBytes(buf, p, end);
      p = field.end;
      c = buf[p];
      if (value - value !== 0) return -a - 1;
      velocities[base + k] = value;
    }
  }
  return a;
}

function grow(array: Float64Array, length: number): Float64Array {
  const out = new Float64Array(length);
  out.set(array);
  return out;
}

/** Reads the atom-count line, refusing impossible counts before anything is allocated. */
function readAtomCount(lines: LineReader, ctx: TextReadContext, index: number, previous: number): number {
  const { buf, start, end } = lines;
  const where = { file: ctx.file, frame: index, line: lines.line };
  let p = start;
  while (p < end && (buf[p] === 32 || buf[p] === 9)) p++;
  const digitsStart = p;
  let n = 0;
  while (p < end && buf[p] >= 48 && buf[p] <= 57) n = n * 10 + buf[p++] - 48;
  const digits = p - digitsStart;
  while (p < end && (buf[p] === 32 || buf[p] === 9)) p++;
  if (digits === 0 || p !== end) {
    const text = lines.text().trim();
    const shown = text.length > 60 ? `${text.slice(0, 60)}…` : text;
    const hint =
      previous > 0 && /^\S+(\s+\S+){3,}/.test(text)
        ? ` — this looks like an atom line, so frame ${index} has more atom lines than its header's ${previous}`
        : '';
    throw new TrajectoryFormatError(`expected the atom count that starts frame ${index + 1}, found "${shown}"${hint}`, where);
  }
  if (digits > 15 || n > ctx.limits.maxAtoms) {
    throw new TrajectoryFormatError(
      `header claims ${lines.text().trim()} atoms, more than the limit of ${ctx.limits.maxAtoms}`,
      where,
    );
  }
  if (n === 0) throw new TrajectoryFormatError('header says the frame has 0 atoms', where);
  if (ctx.totalBytes !== undefined) {
    const remaining = ctx.totalBytes - lines.consumed;
    if (n * MIN_ATOM_LINE_BYTES > remaining) {
      throw new TrajectoryFormatError(
        `header claims ${n} atoms but only ${remaining} bytes remain, too few to hold them (truncated or corrupt)`,
        where,
      );
    }
  }
  if (previous >= 0 && n !== previous) {
    throw new TrajectoryFormatError(
      `frame ${index + 1} has ${n} atoms but earlier frames have ${previous}: the atom count must not change`,
      where,
    );
  }
  return n;
}

function truncated(file: string, index: number, headerLine: number | undefined, n: number, found: number): TrajectoryFormatError {
  return new TrajectoryFormatError(
    `file ends inside frame ${index + 1}: its header${headerLine !== undefined ? ` (line ${headerLine})` : ''} says ${n} atoms but only ${found} atom lines follow (truncated)`,
    { file, frame: index },
  );
}

/** Builds the message for a bad atom line; only runs on failure, so it may be slow. */
function atomLineError(lines: LineReader, columns: AtomColumns, index: number, n: number, atom: number): TrajectoryFormatError {
  const where = { file: lines.fileName, frame: index, line: lines.line };
  const text = lines.text();
  const tokens = text.trim().split(/\s+/).filter(Boolean);
  const needed = columns.roles.length;
  const shown = text.length > 80 ? `${text.slice(0, 80)}…` : text;
  let message: string;
  if (tokens.length === 1 && /^\d+$/.test(tokens[0])) {
    message = `frame ${index + 1} has fewer atom lines than its header says: expected ${n}, found ${atom} before this line, which looks like the next frame's atom count`;
  } else if (tokens.length < needed) {
    message = `atom ${atom + 1} of ${n}: line has ${tokens.length} column${tokens.length === 1 ? '' : 's'}, needs at least ${needed} (${columns.description}): "${shown}"`;
  } else {
    const col = columns.roles.findIndex((role, k) => role >= COLUMN.x && !Number.isFinite(parseNumberOrNaN(tokens[k])));
    const names = ['', '', 'x', 'y', 'z', 'vx', 'vy', 'vz'];
    message = `atom ${atom + 1} of ${n}: ${names[columns.roles[col]] ?? 'coordinate'} "${tokens[col]}" is not a finite number`;
  }
  return new TrajectoryFormatError(message, where);
}

function parseNumberOrNaN(token: string | undefined): number {
  if (token === undefined) return NaN;
  const bytes = Buffer.from(token, 'latin1');
  return parseNumberBytes(bytes, 0, bytes.length);
}
