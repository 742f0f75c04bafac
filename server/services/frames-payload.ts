import type { Frame } from '../formats/frame.ts';

/**
 * The frames API's binary layout, little-endian: a uint32 byte length of a
 * JSON header, the header (padded with spaces to a multiple of 4), then
 * Float32 positions in Å, frame after frame, x y z per atom.
 */
export interface FramesHeader {
  atoms: number;
  /** Distinct species, and each atom's index into that list. */
  speciesNames: string[];
  speciesIndex: number[];
  frames: { index: number; time: number | null; cell: number[] | null }[];
  lengthUnit: 'angstrom';
}

export interface FramesPayloadInput {
  atoms: number;
  speciesNames: string[];
  speciesIndex: number[];
  frames: { index: number; time: number | null; cell: ArrayLike<number> | null }[];
  /** Positions of every frame in the file's length unit, frame after frame. */
  positions: Float32Array;
}

/** The per-atom part of the header, by species list (a frame store keeps one list for good). */
const fixedHeaders = new WeakMap<number[], string>();

function fixedHeaderJson(input: FramesPayloadInput): string {
  let fixed = fixedHeaders.get(input.speciesIndex);
  if (fixed === undefined) {
    const json = JSON.stringify({ atoms: input.atoms, speciesNames: input.speciesNames, speciesIndex: input.speciesIndex, lengthUnit: 'angstrom' } satisfies Omit<FramesHeader, 'frames'>);
    fixed = json.slice(1, -1);
    fixedHeaders.set(input.speciesIndex, fixed);
  }
  return fixed;
}

/** Writes the payload; positions already in Å (the usual case) are copied as bytes, not number by number. */
export function encodeFramesPayload(input: FramesPayloadInput, lengthToAngstrom: number): Buffer {
  const frames: FramesHeader['frames'] = input.frames.map((f) => ({ index: f.index, time: f.time, cell: f.cell ? Array.from(f.cell, (v) => v * lengthToAngstrom) : null }));
  // The same JSON as the whole header stringified, with the part that never changes for a trajectory written once.
  let json = `{${fixedHeaderJson(input)},"frames":${JSON.stringify(frames)}}`;
  json += ' '.repeat((4 - ((4 + Buffer.byteLength(json)) % 4)) % 4);
  const jsonBytes = Buffer.from(json, 'utf8');
  // Never from the shared pool, so the Float32 view below starts on a 4-byte boundary.
  const out = Buffer.allocUnsafeSlow(4 + jsonBytes.length + input.positions.length * 4);
  out.writeUInt32LE(jsonBytes.length, 0);
  jsonBytes.copy(out, 4);
  const body = new Float32Array(out.buffer, out.byteOffset + 4 + jsonBytes.length, input.positions.length);
  if (lengthToAngstrom === 1) body.set(input.positions);
  else for (let i = 0; i < input.positions.length; i++) body[i] = input.positions[i]! * lengthToAngstrom;
  return out;
}

/** The same payload from frames a text reader produced. */
export function encodeFrames(frames: Frame[], lengthToAngstrom: number): Buffer {
  const atoms = frames[0]?.species.length ?? 0;
  const names: string[] = [];
  const speciesIndex = (frames[0]?.species ?? []).map((s) => {
    let i = names.indexOf(s);
    if (i < 0) i = names.push(s) - 1;
    return i;
  });
  const positions = new Float32Array(frames.length * atoms * 3);
  frames.forEach((f, k) => positions.set(f.positions, k * atoms * 3));
  return encodeFramesPayload({
    atoms, speciesNames: names, speciesIndex, positions,
    frames: frames.map((f) => ({ index: f.index, time: f.time ?? null, cell: f.cell })),
  }, lengthToAngstrom);
}
