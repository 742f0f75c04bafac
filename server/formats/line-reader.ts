/**
 * Line access over a chunked byte stream without decoding text: the current
 * line is buf[start, end) (line terminator and a trailing CR excluded). The
 * synchronous `next()` serves lines already buffered, so the hot loops only
 * await when a chunk runs out.
 */
import { TrajectoryFormatError } from './frame.ts';

const EMPTY = Buffer.alloc(0);
/** Smallest refill; tiny upstream chunks are coalesced to amortise copying. */
const MIN_REFILL_BYTES = 64 * 1024;

export interface LineReaderOptions {
  file: string;
  maxLineBytes: number;
  /** Absolute byte offset of the first byte the source yields. */
  baseOffset?: number;
  /** Whether line numbers are meaningful (false after a seek into the middle of a file). */
  countLines?: boolean;
  /**
   * Called with each source chunk once no line served or to be served
   * refers to its bytes any more (they were used up or copied), so the
   * source may refill it (see ChunkPool).
   */
  recycle?: (chunk: Buffer) => void;
}

export class LineReader {
  buf: Buffer = EMPTY;
  start = 0;
  end = 0;
  /** 1-based number of the current line. */
  lineNo = 0;
  /** Absolute byte offset of the current line's first byte. */
  lineOffset = 0;
  eof = false;
  readonly countLines: boolean;
  private pos = 0;
  private bufBase: number;
  /** Input that follows `buf` directly, served once `buf` is used up (see `more`). */
  private queued: Buffer | null = null;
  /** The source chunk whose bytes `buf` or `queued` views (at most one at a time), for `recycle`. */
  private held: Buffer | null = null;
  private readonly iterator: AsyncIterator<Buffer>;

  constructor(
    source: AsyncIterable<Buffer>,
    private readonly options: LineReaderOptions,
  ) {
    this.iterator = source[Symbol.asyncIterator]();
    this.bufBase = options.baseOffset ?? 0;
    this.countLines = options.countLines ?? true;
  }

  get fileName(): string {
    return this.options.file;
  }

  /** Line number for error messages, or undefined when unknown. */
  get line(): number | undefined {
    return this.countLines ? this.lineNo : undefined;
  }

  /** Absolute offset just past the bytes consumed so far. */
  get consumed(): number {
    return this.bufBase + this.pos;
  }

  /** Advances to the next buffered line; false when more bytes are needed or the input is over. */
  next(): boolean {
    let buf = this.buf;
    let pos = this.pos;
    if (pos >= buf.length) {
      if (this.queued === null) return false;
      this.bufBase += buf.length;
      buf = this.buf = this.queued;
      this.queued = null;
      pos = this.pos = 0;
    }
    let newline = buf.indexOf(10, pos);
    if (newline < 0) {
      if (!this.eof) return false;
      newline = buf.length;
      this.pos = newline;
    } else {
      this.pos = newline + 1;
    }
    if (newline - pos > this.options.maxLineBytes) this.tooLong(this.lineNo + 1);
    let end = newline;
    if (end > pos && buf[end - 1] === 13) end--;
    this.start = pos;
    this.end = end;
    this.lineNo++;
    this.lineOffset = this.bufBase + pos;
    return true;
  }

  /** Advances to the next line, reading more input as needed; false at end of input. */
  async nextLine(): Promise<boolean> {
    for (;;) {
      if (this.next()) return true;
      if (this.eof) return false;
      await this.more();
    }
  }

  /** Pulls more input into the buffer, keeping the unfinished line. */
  async more(): Promise<void> {
    if (this.queued !== null) {
      // Input is already at hand: join it to the unfinished line.
      this.bufBase += this.pos;
      this.buf = Buffer.concat([this.buf.subarray(this.pos), this.queued]);
      this.pos = 0;
      this.queued = null;
      this.hold(null);
      return;
    }
    if (this.eof) return;
    const rest = this.buf.length - this.pos;
    if (rest > this.options.maxLineBytes) this.tooLong(this.lineNo + 1);
    const parts: Buffer[] = rest ? [this.buf.subarray(this.pos)] : [];
    let total = rest;
    for (;;) {
      const next = await this.iterator.next();
      if (next.done) {
        this.eof = true;
        break;
      }
      parts.push(next.value);
      total += next.value.length;
      if (total >= MIN_REFILL_BYTES || next.value.indexOf(10) >= 0) break;
    }
    this.bufBase += this.pos;
    this.pos = 0;
    if (parts.length === 2 && rest > 0) {
      // The usual refill: the end of a line, then a whole new chunk. Only that line is
      // joined into a buffer of its own and the chunk is served after it, rather than
      // copying the chunk (a megabyte) behind the line's few bytes.
      const chunk = parts[1];
      const newline = chunk.indexOf(10);
      if (newline >= 0 && newline + 1 < chunk.length) {
        this.buf = Buffer.concat([parts[0], chunk.subarray(0, newline + 1)], rest + newline + 1);
        this.queued = chunk.subarray(newline + 1);
        this.hold(chunk);
        return;
      }
    }
    if (parts.length === 1) {
      this.buf = parts[0];
      // A new chunk served as it is; otherwise (input over) the old tail, still in the held chunk.
      if (rest === 0) this.hold(parts[0]);
      return;
    }
    this.buf = Buffer.concat(parts, total);
    // Everything was copied: the new chunks are done with as well as the old one.
    this.hold(null);
    for (let k = rest ? 1 : 0; k < parts.length; k++) this.options.recycle?.(parts[k]);
  }

  /** Makes `chunk` the held source chunk, handing the previous one back when it changes. */
  private hold(chunk: Buffer | null): void {
    if (this.held !== null && this.held !== chunk) this.options.recycle?.(this.held);
    this.held = chunk;
  }

  private tooLong(line: number): never {
    throw new TrajectoryFormatError(
      `line is longer than ${this.options.maxLineBytes} bytes: this is binary data or a corrupt file, not a text trajectory`,
      { file: this.options.file, line: this.countLines ? line : undefined },
    );
  }

  /** Stops the upstream source early (consumer broke off). */
  async close(): Promise<void> {
    await this.iterator.return?.();
  }

  /** The current line as text, for messages and the rare header parse. */
  text(): string {
    return this.buf.toString('utf8', this.start, this.end);
  }
}

/** True when buf[start, end) holds only spaces and tabs. */
export function isBlank(buf: Uint8Array, start: number, end: number): boolean {
  for (let i = start; i < end; i++) {
    const c = buf[i];
    if (c !== 32 && c !== 9) return false;
  }
  return true;
}
