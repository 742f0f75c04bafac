import { describe, expect, it } from 'vitest';
import { ANALYSIS_KEYS } from '../../../shared/analysis-params';
import { ANALYSIS_CHOICES, defaultAnalyses, unavailableReason } from './analysis-choices';

describe('the analysis checklist', () => {
  it('offers every analysis the engine has, once', () => {
    expect(ANALYSIS_CHOICES.map((c) => c.key).sort()).toEqual([...ANALYSIS_KEYS].sort());
  });
  it('when the file has a periodic cell, then g(r) is ticked by default; without one it is not and says why', () => {
    expect(defaultAnalyses({ cell: [10, 0, 0, 0, 10, 0, 0, 0, 10], boundary: 'periodic', frames: 100 })).toContain('rdf');
    const open = { cell: null, boundary: 'none', frames: 100 };
    expect(defaultAnalyses(open)).not.toContain('rdf');
    expect(unavailableReason('rdf', open)).toMatch(/periodic cell/);
  });
});
