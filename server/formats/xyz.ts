/**
 * Plain XYZ: atom count, a free-text comment, then "species x y z" per atom
 * (further columns ignored). The comment carries no data here, so nothing
 * in it is interpreted.
 */
import { LineReader } from './line-reader.ts';
import { DEFAULT_COLUMNS, type FrameInfo } from './extxyz-comment.ts';
import { readXyzFrames } from './xyz-frames.ts';
import type { TextFrame, TextReadContext } from './text-frame.ts';

const PLAIN: FrameInfo = { columns: DEFAULT_COLUMNS, cell: null };

export function readXyz(lines: LineReader, ctx: TextReadContext): AsyncGenerator<TextFrame> {
  return readXyzFrames(lines, ctx, () => PLAIN);
}
