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

interface FramesHeader {
  atoms: number;
  speciesNames: string[];
  speciesIndex: number[];
  frames: { index: number; time: number | null; cell: number[] | null }[];
}

const isCount = (v: unknown): v is number => Number.isInteger(v) && (v as number) >= 0;
const isNumberOrNull = (v: unknown): v is number | null => v === null || typeof v === 'number';
const isCell = (v: unknown): v is number[] | null => v === null || (Array.isArray(v) && v.length === 9 && v.every((x) => typeof x === 'number'));

/** The reason the header is not the frames layout, or null when it is. */
function headerProblem(h: Record<string, unknown>): string | null {
  if (!isCount(h['atoms'])) return 'atoms is not a count';
  if (h['lengthUnit'] !== 'angstrom') return 'lengthUnit is not angstrom';
  if (!Array.isArray(h['speciesNames']) || !h['speciesNames'].every((n) => typeof n === 'string')) return 'speciesNames is not a list of labels';
  if (!Array.isArray(h['speciesIndex']) || !h['speciesIndex'].every(isCount)) return 'speciesIndex is not a list of indices';
  if (!Array.isArray(h['frames'])) return 'frames is not a list';
  for (const f of h['frames'] as unknown[]) {
    if (typeof f !== 'object' || f === null) return 'a frame is not an object';
    const frame = f as Record<string, unknown>;
    if (!isCount(frame['index']) || !isNumberOrNull(frame['time']) || !isCell(frame['cell'])) return 'a frame lacks index, time or a 9-number cell';
  }
  return null;
}

const HOST_IS_LITTLE_ENDIAN = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;

function readHeader(buffer: ArrayBuffer): { header: FramesHeader; dataOffset: number } {
  if (buffer.byteLength < 4) throw new FramesPayloadError('it is shorter than its 4-byte length prefix.');
  const headerBytes = new DataView(buffer).getUint32(0, true);
  if (4 + headerBytes > buffer.byteLength) throw new FramesPayloadError('the header runs past the end of the response.');
  let json: unknown;
  try {
    json = JSON.parse(new TextDecoder().decode(new Uint8Array(buffer, 4, headerBytes)));
  } catch {
    throw new FramesPayloadError('the header is not JSON.');
  }
  if (typeof json !== 'object' || json === null) throw new FramesPayloadError('the header has an unexpected shape (not an object).');
  const problem = headerProblem(json as Record<string, unknown>);
  if (problem) throw new FramesPayloadError(`the header has an unexpected shape (${problem}).`);
  return { header: json as FramesHeader, dataOffset: 4 + headerBytes };
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
