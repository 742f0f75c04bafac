/**
 * Decimal number parsing straight from bytes, so the text readers never
 * build a string per coordinate. The fast path is exact: a digit string
 * whose integer value stays below 2^53 is accumulated without rounding,
 * and 10^k is exact for |k| <= 22, so one IEEE multiply or divide rounds
 * exactly as Number() does.
 * Anything outside that (long mantissas, big exponents) goes through Number()
 * after a strict grammar check, so results never differ from JS.
 */

const POW10 = Float64Array.from({ length: 23 }, (_, k) => Number(`1e${k}`));
const MAX_EXACT = 2 ** 53;
const DECIMAL = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const FORTRAN_EXPONENT = /^([+-]?(?:\d+\.?\d*|\.\d+))[dD]([+-]?\d+)$/;

/** Parses buf[start, end) as a decimal number; NaN when it is not one. */
export function parseNumberBytes(buf: Uint8Array, start: number, end: number): number {
  let i = start;
  let negative = false;
  let c = buf[i];
  if (c === 45) {
    negative = true;
    i++;
  } else if (c === 43) {
    i++;
  }
  let mantissa = 0;
  let digits = 0;
  let scale = 0;
  while (i < end) {
    const d = buf[i] - 48;
    if (d < 0 || d > 9) break;
    mantissa = mantissa * 10 + d;
    digits++;
    i++;
  }
  if (i < end && buf[i] === 46) {
    i++;
    while (i < end) {
      const d = buf[i] - 48;
      if (d < 0 || d > 9) break;
      mantissa = mantissa * 10 + d;
      digits++;
      scale--;
      i++;
    }
  }
  if (digits === 0 || mantissa >= MAX_EXACT) return parseSlow(buf, start, end);
  if (i < end) {
    c = buf[i];
    if (c !== 101 && c !== 69) return parseSlow(buf, start, end);
    i++;
    let expNegative = false;
    c = buf[i];
    if (c === 45) {
      expNegative = true;
      i++;
    } else if (c === 43) {
      i++;
    }
    let exponent = 0;
    let expDigits = 0;
    while (i < end && expDigits < 6) {
      const d = buf[i] - 48;
      if (d < 0 || d > 9) break;
      exponent = exponent * 10 + d;
      expDigits++;
      i++;
    }
    if (expDigits === 0 || i !== end) return parseSlow(buf, start, end);
    scale += expNegative ? -exponent : exponent;
  }
  let value: number;
  if (scale === 0) value = mantissa;
  else if (scale < 0 && scale >= -22) value = mantissa / POW10[-scale];
  else if (scale > 0 && scale <= 22) value = mantissa * POW10[scale];
  else return parseSlow(buf, start, end);
  return negative ? -value : value;
}

/** Where the token read by the last `parseFieldBytes` call ended. */
export const field = { end: 0 };

/**
 * Reads the whitespace-delimited token that starts at buf[start] (not a
 * space) and parses it as parseNumberBytes would, in one pass: the plain
 * decimal form ("-12.345678") is accumulated while scanning; anything else
 * (an exponent, a stray character) finds the token's end and goes through
 * parseNumberBytes, so the value is always the same. Sets `field.end`.
 */
export function parseFieldBytes(buf: Uint8Array, start: number, limit: number): number {
  // No bounds test inside the digit loops: the byte at `limit` ends a line
  // (CR, LF) or lies past the buffer (undefined), and neither is a digit.
  let i = start;
  let c = buf[i];
  const negative = c === 45;
  if (negative || c === 43) c = buf[++i];
  let mantissa = 0;
  const intStart = i;
  while (c >= 48 && c <= 57) {
    mantissa = mantissa * 10 + (c - 48);
    c = buf[++i];
  }
  let digits = i - intStart;
  let scale = 0;
  if (c === 46) {
    const fracStart = ++i;
    c = buf[i];
    while (c >= 48 && c <= 57) {
      mantissa = mantissa * 10 + (c - 48);
      c = buf[++i];
    }
    scale = fracStart - i;
    digits -= scale;
  }
  if (i >= limit || c === 32 || c === 9) {
    if (i > limit) i = limit;
    field.end = i;
    if (digits > 0 && mantissa < MAX_EXACT && scale >= -22) {
      const value = scale === 0 ? mantissa : mantissa / POW10[-scale];
      return negative ? -value : value;
    }
    return parseNumberBytes(buf, start, i);
  }
  while (i < limit && c !== 32 && c !== 9) c = buf[++i];
  field.end = i;
  return parseNumberBytes(buf, start, i);
}

function parseSlow(buf: Uint8Array, start: number, end: number): number {
  let text = '';
  for (let i = start; i < end; i++) text += String.fromCharCode(buf[i]);
  return parseNumberText(text);
}

/**
 * The same grammar for strings (header values, H5MD attributes). Fortran
 * "1.5D+02" is accepted because simulation codes written in Fortran emit it;
 * hexadecimal, "Infinity" and "NaN" are not coordinates and give NaN.
 */
export function parseNumberText(text: string): number {
  if (DECIMAL.test(text)) return Number(text);
  const fortran = FORTRAN_EXPONENT.exec(text);
  if (fortran) return Number(`${fortran[1]}e${fortran[2]}`);
  return NaN;
}
