import { describe, expect, it } from 'vitest';
import type { Frame } from '../../../server/formats/frame';
import { encodeFrames } from '../../../server/services/frames-payload';
import { decodeFramesPayload, FramesPayloadError } from './frames-payload-decoder';

function frame(index: number, positions: number[], species: string[], extra: Partial<Frame> = {}): Frame {
  return { index, positions: Float64Array.from(positions), species, cell: null, ...extra };
}

function arrayBufferOf(buffer: Buffer): ArrayBuffer {
  return buffer.buffer.slice(buffer.byteOffset, buffer.byteOffset + buffer.byteLength) as ArrayBuffer;
}

describe('decodeFramesPayload', () => {
  it('when the server encodes frames in nm, then the viewer reads the same positions in Å with species, times and cells', () => {
    const species = ['O', 'H', 'H'];
    const cell = Float64Array.from([1.2, 0, 0, 0, 1.3, 0, 0.1, 0, 1.4]);
    const encoded = encodeFrames([
      frame(4, [0, 0, 0, 0.1, 0, 0, 0, 0.1, 0], species, { time: 0.5, cell }),
      frame(5, [0.01, 0.02, 0.03, 0.11, 0, 0, 0, 0.12, -0.05], species, { time: 0.6, cell }),
    ], 10);

    const payload = decodeFramesPayload(arrayBufferOf(encoded));

    expect(payload.atoms).toBe(3);
    expect(payload.speciesNames).toEqual(['O', 'H']);
    expect(Array.from(payload.speciesIndex)).toEqual([0, 1, 1]);
    expect(payload.frames.map((f) => [f.index, f.time])).toEqual([[4, 0.5], [5, 0.6]]);
    expect(Array.from(payload.frames[0]!.cell!)).toEqual([12, 0, 0, 0, 13, 0, 1, 0, 14]);
    const second = Array.from(payload.frames[1]!.positions);
    [0.1, 0.2, 0.3, 1.1, 0, 0, 0, 1.2, -0.5].forEach((v, i) => expect(second[i]).toBeCloseTo(v, 5));
  });

  it('when a frame states no time or cell, then both come out as null', () => {
    const payload = decodeFramesPayload(arrayBufferOf(encodeFrames([frame(0, [1, 2, 3], ['Ar'])], 1)));
    expect(payload.frames[0]).toMatchObject({ index: 0, time: null, cell: null });
    expect(Array.from(payload.frames[0]!.positions)).toEqual([1, 2, 3]);
  });

  it('when the header length is odd-sized, then padding still aligns the floats and each frame owns its positions', () => {
    // Species labels of different lengths change the header size; all four paddings must decode.
    for (const label of ['A', 'Ab', 'Abc', 'Abcd']) {
      const encoded = encodeFrames([frame(0, [1, 2, 3], [label]), frame(1, [4, 5, 6], [label])], 1);
      const payload = decodeFramesPayload(arrayBufferOf(encoded));
      expect(Array.from(payload.frames[1]!.positions)).toEqual([4, 5, 6]);
      expect(payload.frames[0]!.positions.buffer).not.toBe(payload.frames[1]!.positions.buffer);
    }
  });

  it('when the body is cut short, then the error says how many bytes were expected', () => {
    const encoded = encodeFrames([frame(0, [1, 2, 3, 4, 5, 6], ['Ar', 'Ar'])], 1);
    const cut = arrayBufferOf(encoded).slice(0, encoded.length - 4);
    expect(() => decodeFramesPayload(cut)).toThrow(FramesPayloadError);
    expect(() => decodeFramesPayload(cut)).toThrow(/expected \d+ bytes for 1 frames of 2 atoms/);
  });

  it('when the header is not the frames layout, then decoding refuses it and says what is wrong', () => {
    const withHeader = (text: string) => {
      const json = new TextEncoder().encode(text);
      const bytes = new Uint8Array(4 + json.length);
      new DataView(bytes.buffer).setUint32(0, json.length, true);
      bytes.set(json, 4);
      return bytes.buffer;
    };
    const good = { atoms: 0, speciesNames: [], speciesIndex: [], lengthUnit: 'angstrom', frames: [{ index: 0, time: null, cell: null }] };
    expect(decodeFramesPayload(withHeader(JSON.stringify(good))).frames).toHaveLength(1);
    expect(() => decodeFramesPayload(withHeader('{"error":{"message":"nope"}}'))).toThrow(/unexpected shape \(atoms is not a count\)/);
    expect(() => decodeFramesPayload(withHeader(JSON.stringify({ ...good, lengthUnit: 'nm' })))).toThrow(/lengthUnit/);
    expect(() => decodeFramesPayload(withHeader(JSON.stringify({ ...good, frames: [{ index: 0, time: null, cell: [1, 2] }] })))).toThrow(/9-number cell/);
    expect(() => decodeFramesPayload(withHeader('not json'))).toThrow(/not JSON/);
    expect(() => decodeFramesPayload(new ArrayBuffer(2))).toThrow(/length prefix/);
  });
});
