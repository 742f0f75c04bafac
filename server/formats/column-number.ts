/**
 * A number in a fixed-width column, as PDB writes coordinates ("  -12.345"):
 * blanks either side, read in one pass straight from the bytes. The plain
 * decimal form is accumulated exactly and anything else (an exponent, a
 * stray character, digits running into the next column) is trimmed to the
 * column and handed to parseNumberBytes, so the value is always the one it
 * would give.
 */
import { parseNumberBytes } from './number-bytes.ts';

const POW10 = Float64Array.from({ length: 23 }, (_, k) => Number(`1e${k}`));

/**
 * The number in buf[from, to), blanks (spaces, tabs) allowed around it;
 * NaN when the column holds anything else or nothing. Bytes past `to` may be
 * looked at, so `to` must lie within the buffer's current line.
 */
export function parseColumnNumber(buf: Uint8Array, from: number, to: number): number {
  // The loops look for the first byte that does not belong rather than at `to`:
  // the line ends in CR, LF or the end of the buffer (undefined), none of which
  // is a blank or a digit, and a scan that passed `to` goes the exact way below.
  let i = from;
  let c = buf[i];
  while (c === 32 || c === 9) c = buf[++i];
  const negative = c === 45;
  if (negative || c === 43) c = buf[++i];
  // Integer part and fraction accumulate in int32; more than nine digits in
  // either may wrap, which the digit counts catch before the value is used.
  let whole = 0;
  const intStart = i;
  while (c >= 48 && c <= 57) {
    whole = (Math.imul(whole, 10) + c - 48) | 0;
    c = buf[++i];
  }
  const intDigits = i - intStart;
  let fraction = 0;
  let fracDigits = 0;
  if (c === 46) {
    const fracStart = ++i;
    c = buf[i];
    while (c >= 48 && c <= 57) {
      fraction = (Math.imul(fraction, 10) + c - 48) | 0;
      c = buf[++i];
    }
    fracDigits = i - fracStart;
  }
  while (i < to && (c === 32 || c === 9)) c = buf[++i];
  // One to fifteen digits, at most nine each side: whole·10^k + fraction is an
  // integer below 10^15 < 2^53, so it is exact and the one division by an exact
  // power of ten rounds as Number() does.
  if (i === to && intDigits <= 9 && fracDigits <= 9 && (intDigits + fracDigits - 1) >>> 0 < 15) {
    const value = fracDigits === 0 ? whole : (whole * POW10[fracDigits] + fraction) / POW10[fracDigits];
    return negative ? -value : value;
  }
  return parseTrimmed(buf, from, to);
}

/** The general path, kept strictly within the column. */
function parseTrimmed(buf: Uint8Array, from: number, to: number): number {
  let start = from;
  let end = to;
  while (start < end && (buf[start] === 32 || buf[start] === 9)) start++;
  while (end > start && (buf[end - 1] === 32 || buf[end - 1] === 9)) end--;
  return start < end ? parseNumberBytes(buf, start, end) : NaN;
}
