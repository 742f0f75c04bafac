import { z } from 'zod';

/** One frame as the viewer keeps it: its own copy of the positions, so cache accounting is exact. */
export interface ViewerFrame {
  /** 0-based frame index in the trajectory. */
  index: number;
  /** Simulation time in the trajectory's time unit, when the file states it. */
  time: number | null;
  /** Lattice vectors a, b, c as rows, in Å, or null when the file states no cell. */
  cell: Float64Array | null;
  /** x, y, z per atom, in Å. */
  positions: Float32Array;
}

/** A decoded response of GET /api/trajectories/:id/frames. */
export interface FramesPayload {
  atoms: number;
  speciesNames: string[];
  /** Per atom, its index into `speciesNames`. */
  speciesIndex: Uint16Array;
  frames: ViewerFrame[];
}

export class FramesPayloadError extends Error {
  constructor(message: string) {
    super(`The frames response could not be read: ${message}`);
    this.name = 'FramesPayloadError';
  }
}

const headerSchema = z.object({
  atoms: z.number().int().min(0),
  speciesNames: z.array(z.string()),
  speciesIndex: z.array(z.number().int().min(0)),
  frames: z.array(z.object({
    index: z.number().int().min(0),
    time: z.number().nullable(),
    cell: z.array(z.number()).length(9).nullable(),
  })),
  lengthUnit: z.literal('angstrom'),
});

const HOST_IS_LITTLE_ENDIAN = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;

function readHeader(buffer: ArrayBuffer): { header: z.infer<typeof headerSchema>; dataOffset: number } {
  if (buffer.byteLength < 4) throw new FramesPayloadError('it is shorter than its 4-byte length prefix.');
  const headerBytes = new DataView(buffer).getUint32(0, true);
  if (4 + headerBytes > buffer.byteLength) throw new FramesPayloadError('the header runs past the end of the response.');
  let json: unknown;
  try {
    json = JSON.parse(new TextDecoder().decode(new Uint8Array(buffer, 4, headerBytes)));
  } catch {
    throw new FramesPayloadError('the header is not JSON.');
  }
  const parsed = headerSchema.safeParse(json);
  if (!parsed.success) throw new FramesPayloadError(`the header has an unexpected shape (${parsed.error.issues[0]?.message ?? 'unknown'}).`);
  return { header: parsed.data, dataOffset: 4 + headerBytes };
}

function copyPositions(buffer: ArrayBuffer, offset: number, values: number): Float32Array {
  // The header is padded to 4 bytes, so on little-endian hosts the floats can be viewed in place and copied once.
  if (HOST_IS_LITTLE_ENDIAN && offset % 4 === 0) return new Float32Array(buffer, offset, values).slice();
  const view = new DataView(buffer, offset, values * 4);
  const out = new Float32Array(values);
  for (let i = 0; i < values; i++) out[i] = view.getFloat32(i * 4, true);
  return out;
}

/** Splits a binary frames response into its header and one positions array per frame. */
export function decodeFramesPayload(buffer: ArrayBuffer): FramesPayload {
  const { header, dataOffset } = readHeader(buffer);
  const { atoms } = header;
  if (header.speciesIndex.length !== atoms) throw new FramesPayloadError(`speciesIndex has ${header.speciesIndex.length} entries for ${atoms} atoms.`);
  if (header.speciesIndex.some((s) => s >= header.speciesNames.length)) throw new FramesPayloadError('an atom refers to a species that is not listed.');
  const perFrame = atoms * 3;
  const expected = dataOffset + header.frames.length * perFrame * 4;
  if (buffer.byteLength !== expected) {
    throw new FramesPayloadError(`expected ${expected} bytes for ${header.frames.length} frames of ${atoms} atoms, got ${buffer.byteLength}.`);
  }
  const frames = header.frames.map((f, k): ViewerFrame => ({
    index: f.index,
    time: f.time,
    cell: f.cell ? Float64Array.from(f.cell) : null,
    positions: copyPositions(buffer, dataOffset + k * perFrame * 4, perFrame),
  }));
  return { atoms, speciesNames: header.speciesNames, speciesIndex: Uint16Array.from(header.speciesIndex), frames };
}
