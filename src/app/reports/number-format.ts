const SUPERSCRIPT: Record<string, string> = {
  '-': '⁻', '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹',
};

function superscript(n: number): string {
  return [...String(n)].map((c) => SUPERSCRIPT[c] ?? c).join('');
}

/** Outside this decade range numbers read better as a mantissa times a power of ten. */
function needsExponent(exponent: number): boolean {
  return exponent < -3 || exponent >= 5;
}

function decade(x: number): number {
  return Math.floor(Math.log10(Math.abs(x)));
}

/** A number to `significant` figures, with a ×10ⁿ form for very small or large magnitudes. */
export function formatNumber(x: number | null | undefined, significant = 4): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return '—';
  if (x === 0) return '0';
  const exponent = decade(x);
  if (!needsExponent(exponent)) return String(Number(x.toPrecision(significant)));
  const mantissa = Number((x / 10 ** exponent).toPrecision(significant));
  return `${mantissa} × 10${superscript(exponent)}`;
}

/**
 * A value with its standard error, the error rounded to two significant
 * figures and the value to the same decimal place, sharing one power of ten:
 * "1.595 ± 0.075", "(1.59 ± 0.07) × 10⁻⁵".
 */
export function formatWithError(value: number | null | undefined, error: number | null | undefined): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  // An error at round-off level (a quantity fixed by the ensemble, such as density at constant volume) says nothing.
  if (error === null || error === undefined || !Number.isFinite(error) || error <= Math.abs(value) * 1e-9) return formatNumber(value);
  const reference = value !== 0 ? decade(value) : decade(error);
  const scale = needsExponent(reference) ? reference : 0;
  const v = value / 10 ** scale;
  const e = error / 10 ** scale;
  const decimals = Math.max(0, 1 - decade(e));
  const body = `${v.toFixed(decimals)} ± ${e.toFixed(decimals)}`;
  return scale === 0 ? body : `(${body}) × 10${superscript(scale)}`;
}
