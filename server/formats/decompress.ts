/**
 * Streaming gzip and zip decompression with bomb guards: output is counted
 * as it is produced and the stream stops as soon as it passes the size or
 * ratio limit, so a small upload can never fill memory or disk.
 */
import { createGunzip } from 'node:zlib';
import { Readable } from 'node:stream';
import { Unzip, UnzipInflate, type UnzipFile } from 'fflate';
import { TrajectoryFormatError } from './frame.ts';
import type { ResolvedLimits } from './limits.ts';
import { checkEntryName, isIgnoredEntry } from './zip-entry.ts';

/** Ratios are only judged past this much output: tiny inputs have meaningless ratios. */
const RATIO_GRACE_BYTES = 1024 * 1024;
/** Input is fed to the inflater in slices this small so one slice cannot expand unchecked. */
const ZIP_SLICE_BYTES = 16 * 1024;

class OutputGuard {
  input = 0;
  output = 0;
  constructor(
    private readonly limits: ResolvedLimits,
    private readonly file: string,
    private readonly kind: string,
  ) {}

  add(bytes: number): void {
    this.output += bytes;
    if (this.output > this.limits.maxDecompressedBytes) {
      throw new TrajectoryFormatError(
        `${this.kind} data expands beyond the limit of ${this.limits.maxDecompressedBytes} bytes; upload refused (possible decompression bomb)`,
        { file: this.file },
      );
    }
    if (this.output > RATIO_GRACE_BYTES && this.output > this.input * this.limits.maxCompressionRatio) {
      throw new TrajectoryFormatError(
        `${this.kind} data expands more than ${this.limits.maxCompressionRatio}× (${this.output} bytes from ${this.input}); upload refused (possible decompression bomb)`,
        { file: this.file },
      );
    }
  }
}

export async function* gunzip(source: AsyncIterable<Buffer>, limits: ResolvedLimits, file: string): AsyncGenerator<Buffer> {
  const guard = new OutputGuard(limits, file, 'gzip');
  async function* counted(): AsyncGenerator<Buffer> {
    for await (const chunk of source) {
      guard.input += chunk.length;
      yield chunk;
    }
  }
  const input = Readable.from(counted(), { objectMode: false });
  const inflater = createGunzip();
  input.on('error', (error) => inflater.destroy(error));
  input.pipe(inflater);
  try {
    for await (const chunk of inflater as AsyncIterable<Buffer>) {
      guard.add(chunk.length);
      yield chunk;
    }
  } catch (error) {
    if (error instanceof TrajectoryFormatError) throw error;
    const code = (error as { code?: string }).code;
    if (code && code.startsWith('Z_')) {
      throw new TrajectoryFormatError(`gzip data is corrupt or truncated (${(error as Error).message})`, { file });
    }
    throw error;
  } finally {
    input.destroy();
    inflater.destroy();
  }
}

/** The one trajectory inside a zip archive, streamed; `entry.name` is set once it is known. */
export async function* unzipSingle(
  source: AsyncIterable<Buffer>,
  limits: ResolvedLimits,
  file: string,
  entry: { name?: string } = {},
): AsyncGenerator<Buffer> {
  const guard = new OutputGuard(limits, file, 'zip');
  const ready: Buffer[] = [];
  let failure: unknown = null;
  let current: UnzipFile | null = null;
  let currentDone = false;
  const unzip = new Unzip();
  unzip.register(UnzipInflate);
  unzip.onfile = (found) => {
    if (failure) return;
    try {
      checkEntryName(found.name, file);
      if (isIgnoredEntry(found.name)) return;
      if (current) {
        throw new TrajectoryFormatError(
          `zip holds more than one trajectory ("${current.name}" and "${found.name}"); upload one file per trajectory`,
          { file },
        );
      }
      current = found;
      entry.name = found.name;
      found.ondata = (error, data, final) => {
        if (failure) return;
        if (error) {
          failure = new TrajectoryFormatError(`zip entry "${found.name}" is corrupt (${error.message})`, { file });
          return;
        }
        try {
          guard.add(data.length);
        } catch (guardError) {
          failure = guardError;
          found.terminate();
          return;
        }
        if (data.length) ready.push(Buffer.from(data.buffer, data.byteOffset, data.byteLength));
        if (final) currentDone = true;
      };
      try {
        found.start();
      } catch (startError) {
        throw new TrajectoryFormatError(
          `zip entry "${found.name}" uses compression method ${found.compression}, which is not supported (use deflate or store)`,
          { file },
        );
      }
    } catch (error) {
      failure = error;
    }
  };
  const push = (chunk: Uint8Array, final: boolean) => {
    try {
      unzip.push(chunk, final);
    } catch (error) {
      failure ??= new TrajectoryFormatError(`zip archive is corrupt (${(error as Error).message})`, { file });
    }
  };
  let sawInput = false;
  for await (const chunk of source) {
    sawInput = true;
    for (let at = 0; at < chunk.length; at += ZIP_SLICE_BYTES) {
      const slice = chunk.subarray(at, at + ZIP_SLICE_BYTES);
      guard.input += slice.length;
      push(slice, false);
      if (failure) throw failure;
      while (ready.length) yield ready.shift()!;
    }
  }
  push(new Uint8Array(0), true);
  if (failure) throw failure;
  while (ready.length) yield ready.shift()!;
  if (!sawInput || !current) throw new TrajectoryFormatError('zip holds no trajectory file', { file });
  if (!currentDone) {
    throw new TrajectoryFormatError(`zip entry "${(current as UnzipFile).name}" is truncated: the archive ends inside it`, { file });
  }
}
