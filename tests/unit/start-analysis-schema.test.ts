import { describe, expect, it } from 'vitest';
import { ANALYSIS_KEYS } from '../../shared/analysis-params.ts';
import { startAnalysisSchema } from '../../shared/analysis-run.ts';

describe('the body of a run start', () => {
  it('when every analysis is ticked, then the request is accepted', () => {
    expect(startAnalysisSchema.safeParse({ analyses: [...ANALYSIS_KEYS] }).success).toBe(true);
  });

  it('when an analysis is named more often than there are analyses, then it says so', () => {
    const result = startAnalysisSchema.safeParse({ analyses: [...ANALYSIS_KEYS, 'msd'] });
    expect(result.success).toBe(false);
    expect(result.error?.issues[0]?.message).toBe('name each analysis once');
  });

  it('when none is named, then it asks for one', () => {
    expect(startAnalysisSchema.safeParse({ analyses: [] }).error?.issues[0]?.message).toBe('pick at least one analysis');
  });
});
