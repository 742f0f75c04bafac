const SUPERSCRIPT: Record<string, string> = {
  '-': '⁻', '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹',
};

/**
 * An axis tick in engineering notation once it is tiny or huge: the power of
 * ten a multiple of three, so neighbouring ticks share it and read like SI
 * prefixes ("10×10⁻⁹", "100×10⁻⁹", "1×10⁻⁶"), never "0.0000000001".
 * Between 0.001 and 99 999 a tick is written plainly.
 */
export function engineeringLabel(value: number): string {
  if (!Number.isFinite(value)) return '';
  if (value === 0) return '0';
  const decade = Math.floor(Math.log10(Math.abs(value)) + 1e-9);
  if (decade >= -3 && decade < 5) return String(Number(value.toPrecision(6)));
  const exponent = Math.floor(decade / 3) * 3;
  const mantissa = Number((value / 10 ** exponent).toPrecision(6));
  return `${mantissa}×10${[...String(exponent)].map((c) => SUPERSCRIPT[c] ?? c).join('')}`;
}

/**
 * The range of a log axis: the decades that hold the data and no more (the
 * charting library otherwise rounds out a whole decade on either side).
 * Null when there is nothing positive to draw.
 */
export function logExtent(values: Iterable<number>): { min: number; max: number } | null {
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of values) {
    if (!(v > 0) || !Number.isFinite(v)) continue;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  if (!Number.isFinite(lo)) return null;
  // Rounding guards keep a value such as 1e-3, stored as 0.00099999…, inside its own decade.
  const min = 10 ** Math.floor(Math.log10(lo) + 1e-9);
  let max = 10 ** Math.ceil(Math.log10(hi) - 1e-9);
  if (max <= min) max = min * 10;
  return { min, max };
}
