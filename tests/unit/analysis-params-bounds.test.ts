import { describe, expect, it } from 'vitest';
import { analysisParamsSchema, PARAM_LIMITS } from '../../shared/analysis-params.ts';

const refusal = (input: Record<string, unknown>) => {
  const parsed = analysisParamsSchema.safeParse(input);
  return parsed.success ? null : parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ');
};

describe('analysis parameter bounds', () => {
  it('when defaults are used, then they pass', () => {
    expect(refusal({})).toBeNull();
  });

  it.each([
    [{ binWidthA: 1e-5 }, /binWidthA: must be at least 0.005 Å/],
    [{ binWidthA: 1e-300 }, /binWidthA: must be at least/],
    [{ binWidthA: 0 }, /binWidthA/],
    [{ rMaxA: 500, binWidthA: 0.01 }, /binWidthA: rMaxA \/ binWidthA must be at most 20000 bins/],
    [{ rMaxA: 1e9 }, /rMaxA: must be at most 10000 Å/],
    [{ maxLagPs: 1e300 }, /maxLagPs: must be at most/],
    [{ maxLagPs: Number.POSITIVE_INFINITY }, /maxLagPs/],
    [{ maxLagPs: Number.NaN }, /maxLagPs/],
    [{ zeroPadFactor: 1024 }, /zeroPadFactor/],
    [{ species: Array.from({ length: 65 }, (_, i) => `S${i}`) }, /species: must list at most 64 species/],
    [{ species: ['x'.repeat(33)] }, /species.0: must be at most 32 characters/],
    [{ degreesOfFreedom: 1e12 }, /degreesOfFreedom/],
    [{ degreesOfFreedom: 2.5 }, /degreesOfFreedom/],
    [{ temperatureK: 1e9 }, /temperatureK: must be at most/],
    [{ qMaxInvA: 1e-9 }, /qMaxInvA: must be at least/],
    [{ fitWindow: { mode: 'manual', startPs: 0, endPs: 1e12 } }, /fitWindow.endPs: must be at most/],
    [{ masses: { Ar: 1e12 } }, /masses.Ar: must be at most/],
  ])('when %j is sent, then it is refused naming the field', (input, message) => {
    expect(refusal(input)).toMatch(message);
  });

  it('when values sit on the bounds, then they pass', () => {
    expect(refusal({ binWidthA: PARAM_LIMITS.minBinWidthA, rMaxA: PARAM_LIMITS.minBinWidthA * PARAM_LIMITS.maxBins })).toBeNull();
    expect(refusal({ species: Array.from({ length: 64 }, (_, i) => `S${i}`), zeroPadFactor: 16, maxLagPs: PARAM_LIMITS.maxTimePs })).toBeNull();
  });
});
