/**
 * Lines over a chunked byte stream: however the bytes are cut into chunks,
 * the reader yields the same lines with the same numbers and byte offsets,
 * a CR before the LF is dropped, and a last line without a terminator counts.
 */
import { describe, expect, it } from 'vitest';
import { LineReader } from '../../../server/formats/line-reader.ts';
import { random } from './synthetic.ts';

interface Seen {
  text: string;
  line: number;
  offset: number;
  consumed: number;
}

async function* chunks(bytes: Buffer, sizes: number[]): AsyncGenerator<Buffer> {
  let at = 0;
  for (let k = 0; at < bytes.length; k++) {
    const size = sizes[k % sizes.length]!;
    yield bytes.subarray(at, at + size);
    at += size;
  }
}

async function linesOf(bytes: Buffer, sizes: number[], baseOffset = 0): Promise<Seen[]> {
  const lines = new LineReader(chunks(bytes, sizes), { file: 't.txt', maxLineBytes: 1 << 20, baseOffset });
  const seen: Seen[] = [];
  // As the readers do: buffered lines synchronously, awaiting only when a chunk runs out.
  while (lines.next() || (await lines.nextLine())) {
    seen.push({ text: lines.text(), line: lines.lineNo, offset: lines.lineOffset, consumed: lines.consumed });
  }
  return seen;
}

/** The expected lines, found by splitting the whole text at once. */
function reference(text: string, baseOffset = 0): Seen[] {
  const out: Seen[] = [];
  let offset = 0;
  const parts = text.split('\n');
  if (parts[parts.length - 1] === '') parts.pop();
  parts.forEach((part, k) => {
    const terminated = offset + part.length < text.length;
    out.push({ text: part.endsWith('\r') ? part.slice(0, -1) : part, line: k + 1, offset: baseOffset + offset, consumed: baseOffset + offset + part.length + (terminated ? 1 : 0) });
    offset += part.length + 1;
  });
  return out;
}

describe('line reader', () => {
  const rnd = random(5);
  let text = '';
  for (let k = 0; k < 3000; k++) {
    const length = Math.floor(rnd() * (rnd() < 0.05 ? 400 : 90));
    let line = '';
    for (let c = 0; c < length; c++) line += String.fromCharCode(32 + Math.floor(rnd() * 90));
    text += `${line}${rnd() < 0.3 ? '\r\n' : '\n'}`;
  }
  text += 'last line without a terminator';
  const bytes = Buffer.from(text, 'latin1');
  const expected = reference(text);

  for (const sizes of [[1], [2, 3], [80, 81, 82], [4093, 1, 7], [65536], [70_000, 13], [1 << 20]]) {
    it(`when the input arrives in chunks of ${sizes.join(', ')} bytes, then every line, number and offset is as in the whole text`, async () => {
      expect(await linesOf(bytes, sizes)).toEqual(expected);
    });
  }

  for (const sizes of [[1], [2, 3], [80, 81, 82], [4093, 1, 7], [70_000, 13], [1 << 20]]) {
    it(`given chunks of ${sizes.join(', ')} bytes that are wiped as soon as they are handed back, when every line is read, then each is as in the whole text and no chunk comes back twice`, async () => {
      const handedOut = new Set<Buffer>();
      const back = new Set<Buffer>();
      async function* ownCopies(): AsyncGenerator<Buffer> {
        for await (const chunk of chunks(bytes, sizes)) {
          const own = Buffer.from(chunk);
          handedOut.add(own);
          yield own;
        }
      }
      const lines = new LineReader(ownCopies(), {
        file: 't.txt', maxLineBytes: 1 << 20,
        // As a refilled read buffer would be: any line still served from these bytes comes out garbled.
        recycle: (chunk) => {
          expect(handedOut.has(chunk) && !back.has(chunk)).toBe(true);
          back.add(chunk);
          chunk.fill(0);
        },
      });
      const seen: Seen[] = [];
      while (lines.next() || (await lines.nextLine())) {
        seen.push({ text: lines.text(), line: lines.lineNo, offset: lines.lineOffset, consumed: lines.consumed });
      }
      expect(seen).toEqual(expected);
      expect(back.size).toBeGreaterThanOrEqual(handedOut.size - 1);
    });
  }

  it('when a CR LF pair is split between two chunks, then the CR is still dropped', async () => {
    const crlf = Buffer.from('first\r\nsecond\r\nthird\r\n');
    expect((await linesOf(crlf, [6, 1, 7, 100])).map((s) => s.text)).toEqual(['first', 'second', 'third']);
  });

  it('when the source starts inside a file, then offsets count from that point', async () => {
    expect(await linesOf(bytes, [65536, 3], 1000)).toEqual(reference(text, 1000));
  });

  it('when a line is longer than the limit, then it names the line as not a text trajectory', async () => {
    const long = Buffer.from(`short\n${'x'.repeat(200)}\n`);
    const lines = new LineReader(chunks(long, [64, 64, 64, 64]), { file: 'bin.dat', maxLineBytes: 100 });
    await expect((async () => { while (await lines.nextLine()); })()).rejects.toThrow(/^bin\.dat, line 2: line is longer than 100 bytes/);
  });
});
