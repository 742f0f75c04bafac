/**
 * Extended XYZ: like XYZ, but the comment line states the cell (Lattice=),
 * periodicity (pbc=), time (Time=) and the meaning of each atom column
 * (Properties=), which may differ from frame to frame.
 */
import { LineReader } from './line-reader.ts';
import { parseExtxyzComment, type CommentMemo, type FrameInfo, type Where } from './extxyz-comment.ts';
import { readXyzFrames } from './xyz-frames.ts';
import type { TextFrame, TextReadContext } from './text-frame.ts';

export function readExtxyz(lines: LineReader, ctx: TextReadContext): AsyncGenerator<TextFrame> {
  // Consecutive frames usually repeat the comment except for Time=; the
  // column layout is reused so the hot loop keeps seeing the same roles array.
  let lastProperties: FrameInfo['columns'] | null = null;
  const memo: CommentMemo = {};
  return readXyzFrames(lines, ctx, (comment: string, where: Where) => {
    const info = parseExtxyzComment(comment, where, memo);
    if (lastProperties && sameColumns(lastProperties, info.columns)) info.columns = lastProperties;
    lastProperties = info.columns;
    return info;
  });
}

function sameColumns(a: FrameInfo['columns'], b: FrameInfo['columns']): boolean {
  if (a.roles.length !== b.roles.length || a.hasVelocities !== b.hasVelocities) return false;
  for (let k = 0; k < a.roles.length; k++) if (a.roles[k] !== b.roles[k]) return false;
  return true;
}
