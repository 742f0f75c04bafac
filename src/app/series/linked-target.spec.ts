import { describe, expect, it } from 'vitest';
import { parseLinkedTarget } from './linked-target';

describe('what an access link opens', () => {
  it('when the link carries a series of the wrong shape, then the error names where the shape breaks', () => {
    expect(() => parseLinkedTarget({ expiresAt: '2026-12-09T10:00:00.000Z', series: { id: 'x' } })).toThrow(/shared series .* \(at series\./);
  });

  it('when the link carries neither a series nor a report, then it is refused as a report of the wrong shape', () => {
    expect(() => parseLinkedTarget({ expiresAt: '2026-12-09T10:00:00.000Z' })).toThrow(/report came back in a shape/);
  });
});
