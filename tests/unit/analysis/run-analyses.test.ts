import { describe, expect, it } from 'vitest';
import { analysisParamsSchema } from '../../../shared/analysis-params.ts';
import { SIMULATION_CAUTION } from '../../../shared/simulation-caution.ts';
import { ANALYSIS_KEYS, ENGINE_VERSION, runAnalyses } from '../../../server/analysis/index.ts';
import { simulateLennardJones } from '../../../server/simulate/lennard-jones.ts';

describe('runAnalyses registry', () => {
  const traj = simulateLennardJones({ cellsPerSide: 3, reducedDensity: 0.8442, temperatureK: 86.5, equilibrationSteps: 200, productionSteps: 600, sampleEvery: 2, seed: 3 }).trajectory;

  it('when every analysis is requested, then each yields a summary, a curve with matching column/unit/data counts, and its methods', () => {
    const fractions: number[] = [];
    const interactionModel = { pairs: [{ species: ['Ar', 'Ar'] as [string, string], form: 'lj' as const, epsilonEV: 0.0103236, sigmaA: 3.405, cutoffA: 8.5 }] };
    const run = runAnalyses(traj, ANALYSIS_KEYS, { masses: { Ar: 39.948 }, interactionModel }, (f) => fractions.push(f));
    for (const key of ANALYSIS_KEYS) {
      expect(run.summary[key]).toBeDefined();
      expect(run.methods[key]).toBeDefined();
      const c = run.curves[key];
      expect(c.columns.length).toBe(c.units.length);
      expect(c.data.length).toBe(c.columns.length);
      const n = c.data[0].length;
      c.data.forEach((col) => expect(col.length).toBe(n));
    }
    expect(run.engineVersion).toBe(ENGINE_VERSION);
    expect(run.caution).toBe(SIMULATION_CAUTION);
    expect(fractions[fractions.length - 1]).toBe(1);
    for (let i = 1; i < fractions.length; i++) expect(fractions[i]).toBeGreaterThanOrEqual(fractions[i - 1] - 1e-12);
  });

  it('when parameters are invalid, then the shared schema rejects them before any work', () => {
    expect(() => runAnalyses(traj, ['msd'], { fitWindow: { mode: 'manual', startPs: 5, endPs: 1 } })).toThrow();
    expect(() => runAnalyses(traj, ['vdos'], { window: 'square' as 'hann' })).toThrow();
    expect(analysisParamsSchema.safeParse({ binWidthA: -1 }).success).toBe(false);
  });

  it('when defaults are parsed, then the methods echo them (Hann window, automatic fit, COM drift removed)', () => {
    const run = runAnalyses(traj, ['vdos'], { masses: { Ar: 39.948 } });
    expect(run.methods.params.window).toBe('hann');
    expect(run.methods.params.fitWindow).toEqual({ mode: 'auto' });
    expect(run.methods.params.removeComDrift).toBe(true);
    expect(run.methods.vdos?.['window']).toBe('hann');
  });

  it('when a species is unknown, then the error names it', () => {
    expect(() => runAnalyses({ ...traj, species: traj.species.map(() => 'Zz') }, ['msd'], {})).toThrow(/"Zz"/);
  });
});
