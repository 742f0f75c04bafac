import { describe, expect, it } from 'vitest';
import { MAX_UPLOAD_PARTS, uploadPartBytes } from '../../server/storage/object-store.ts';

const MiB = 1024 ** 2;
const GiB = 1024 ** 3;

describe('parts of a multipart upload to the object store', () => {
  it('when the upload limit is the default 16 GiB or less, then parts are 8 MiB', () => {
    expect(uploadPartBytes(16 * GiB)).toBe(8 * MiB);
    expect(uploadPartBytes(2 * GiB)).toBe(8 * MiB);
    expect(uploadPartBytes(0)).toBe(8 * MiB);
  });

  it('when a site allows files beyond what 10 000 parts of 8 MiB hold, then parts grow so the largest allowed file still fits', () => {
    for (const limit of [78 * GiB, 100 * GiB, 500 * GiB, 5 * 1024 * GiB + 7]) {
      const part = uploadPartBytes(limit);
      expect(Math.ceil(limit / part)).toBeLessThanOrEqual(MAX_UPLOAD_PARTS);
      expect(part % MiB).toBe(0);
      // No bigger than needed: one MiB less would not do.
      expect(part === 8 * MiB || Math.ceil(limit / (part - MiB)) > MAX_UPLOAD_PARTS).toBe(true);
    }
  });
});
