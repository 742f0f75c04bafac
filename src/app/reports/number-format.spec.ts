import { describe, expect, it } from 'vitest';
import { formatNumber, formatWithError } from './number-format';

describe('formatNumber', () => {
  it('when a number is ordinary, then it keeps four significant figures without trailing noise', () => {
    expect(formatNumber(86.4711)).toBe('86.47');
    expect(formatNumber(0.0123456)).toBe('0.01235');
    expect(formatNumber(12.5)).toBe('12.5');
  });

  it('when a number is tiny or huge, then it is written with a power of ten', () => {
    expect(formatNumber(1.594553e-5)).toBe('1.595 × 10⁻⁵');
    expect(formatNumber(6.02214e23, 3)).toBe('6.02 × 10²³');
  });

  it('when there is no finite value, then a dash stands in', () => {
    expect(formatNumber(null)).toBe('—');
    expect(formatNumber(Number.NaN)).toBe('—');
  });
});

describe('formatWithError', () => {
  it('when an error is given, then it has two significant figures and the value is rounded to match', () => {
    expect(formatWithError(1.594553, 0.0745513)).toBe('1.595 ± 0.075');
    expect(formatWithError(86.47, 1.234)).toBe('86.5 ± 1.2');
    expect(formatWithError(312.7, 14.2)).toBe('313 ± 14');
  });

  it('when the value is tiny, then value and error share one power of ten', () => {
    expect(formatWithError(1.594553e-5, 7.4551e-7)).toBe('(1.595 ± 0.075) × 10⁻⁵');
  });

  it('when the error is missing or zero, then the value alone is shown', () => {
    expect(formatWithError(0.15, null)).toBe('0.15');
    expect(formatWithError(0.15, 0)).toBe('0.15');
  });

  it('when the error is at round-off level, as for density at constant volume, then the value alone is shown', () => {
    expect(formatWithError(1.41859975395252325, 2.3e-16)).toBe('1.419');
  });
});
