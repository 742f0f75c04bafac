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

export function encodeFrames(frames: Frame[], lengthToAngstrom: number): Buffer {
  const atoms = frames[0]?.species.length ?? 0;
  const names: string[] = [];
  const speciesIndex = (frames[0]?.species ?? []).map((s) => {
    let i = names.indexOf(s);
    if (i < 0) i = names.push(s) - 1;
    return i;
  });
  const header: FramesHeader = {
    atoms, speciesNames: names, speciesIndex, lengthUnit: 'angstrom',
    frames: frames.map((f) => ({
      index: f.index, time: f.time ?? null,
      cell: f.cell ? Array.from(f.cell, (v) => v * lengthToAngstrom) : null,
    })),
  };
  let json = JSON.stringify(header);
  json += ' '.repeat((4 - ((4 + Buffer.byteLength(json)) % 4)) % 4);
  const jsonBytes = Buffer.from(json, 'utf8');
  const out = Buffer.alloc(4 + jsonBytes.length + frames.length * atoms * 12);
  out.writeUInt32LE(jsonBytes.length, 0);
  jsonBytes.copy(out, 4);
  let offset = 4 + jsonBytes.length;
  for (const frame of frames) {
    const positions = frame.positions;
    for (let i = 0; i < atoms * 3; i++, offset += 4) out.writeFloatLE(positions[i]! * lengthToAngstrom, offset);
  }
  return out;
}
