/**
 * A number in a fixed-width column, as PDB writes coordinates ("  -12.345"):
 * blanks either side, read in one pass straight from the bytes. The plain
 * decimal form is accumulated exactly (a digit string below 2^53 and one
 * division by an exact power of ten, as number-bytes.ts argues), and anything
 * else (an exponent, a stray character) is trimmed and handed to
 * parseNumberBytes, so the value is always the one it would give.
 */
import { parseNumberBytes } from './number-bytes.ts';

const POW10 = Float64Array.from({ length: 23 }, (_, k) => Number(`1e${k}`));
const MAX_EXACT = 2 ** 53;

/**
 * The number in buf[from, to), blanks (spaces, tabs) allowed around it;
 * NaN when the column holds anything else or nothing. The caller keeps `to`
 * within the line.
 */
export function parseColumnNumber(buf: Uint8Array, from: number, to: number): number {
  let i = from;
  let c = buf[i];
  while (i < to && (c === 32 || c === 9)) c = buf[++i];
  const start = i;
  const negative = c === 45;
  if (i < to && (negative || c === 43)) c = buf[++i];
  let mantissa = 0;
  const intStart = i;
  while (i < to && c >= 48 && c <= 57) {
    mantissa = mantissa * 10 + (c - 48);
    c = buf[++i];
  }
  let digits = i - intStart;
  let scale = 0;
  if (i < to && c === 46) {
    const fracStart = ++i;
    c = buf[i];
    while (i < to && c >= 48 && c <= 57) {
      mantissa = mantissa * 10 + (c - 48);
      c = buf[++i];
    }
    scale = fracStart - i;
    digits -= scale;
  }
  while (i < to && (c === 32 || c === 9)) c = buf[++i];
  if (i >= to && digits > 0 && mantissa < MAX_EXACT && scale >= -22) {
    const value = scale === 0 ? mantissa : mantissa / POW10[-scale];
    return negative ? -value : value;
  }
  let end = to;
  while (end > start && (buf[end - 1] === 32 || buf[end - 1] === 9)) end--;
  return start < end ? parseNumberBytes(buf, start, end) : NaN;
}
