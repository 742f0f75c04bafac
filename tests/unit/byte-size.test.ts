import { describe, expect, it } from 'vitest';
import { formatBytes } from '../../shared/byte-size.ts';

describe('formatBytes', () => {
  it('when a file is smaller than a KiB, then its bytes are counted, not rounded to zero MiB', () => {
    expect(formatBytes(31)).toBe('31 bytes');
    expect(formatBytes(1)).toBe('1 byte');
    expect(formatBytes(0)).toBe('0 bytes');
  });

  it('when a file is larger, then it is shown in binary units with one decimal below ten', () => {
    expect(formatBytes(1024)).toBe('1.0 KiB');
    expect(formatBytes(4300)).toBe('4.2 KiB');
    expect(formatBytes(180 * 1024 * 1024)).toBe('180 MiB');
    expect(formatBytes(3 * 1024 ** 3)).toBe('3.0 GiB');
  });
});
