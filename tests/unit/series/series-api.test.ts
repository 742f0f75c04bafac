import { describe, expect, it } from 'vitest';
import { seriesResults } from '../../../server/analysis/series/series-results.ts';
import { fccLattice } from '../../../server/simulate/fcc-lattice.ts';
import { SeededRandom } from '../../../server/simulate/random.ts';
import type { Trajectory } from '../../../server/analysis/trajectory.ts';
import { createSeriesBody, patchSeriesBody, seriesResultsSchema } from '../../../shared/series-api.ts';
import { memberFromRun } from './series-fixtures.ts';

function still(n: number): Trajectory {
  const sites = fccLattice(2, 5.26);
  const atoms = sites.length / 3;
  const rng = new SeededRandom(n);
  const positions = new Float32Array(3 * atoms * n), velocities = new Float32Array(3 * atoms * n);
  for (let i = 0; i < positions.length; i++) (positions[i] = sites[i % sites.length]! + 0.05 * rng.normal()), (velocities[i] = rng.normal());
  const cells = new Float64Array(9 * n);
  for (let f = 0; f < n; f++) cells[9 * f] = cells[9 * f + 4] = cells[9 * f + 8] = 10.52;
  return { nAtoms: atoms, nFrames: n, species: new Array<string>(atoms).fill('Ar'), positions, velocities, cells, times: Float64Array.from({ length: n }, (_, f) => f * 0.1), boundary: 'periodic' };
}

describe('the series API schemas', () => {
  it('when the engine derives results, then the API schema accepts them as they are', () => {
    const results = seriesResults([memberFromRun(1, 20, still(40)), memberFromRun(2, 40, still(40))]);
    const parsed = seriesResultsSchema.strict().safeParse(results);
    expect(parsed.success, parsed.success ? '' : JSON.stringify(parsed.error.issues.slice(0, 3))).toBe(true);
  });

  it('when a series is created with one trajectory or a repeated one, then the error names trajectoryIds', () => {
    const one = createSeriesBody.safeParse({ name: 'Argon', trajectoryIds: [1] });
    expect(one.success).toBe(false);
    expect(one.error?.issues[0]?.path).toEqual(['trajectoryIds']);
    expect(one.error?.issues[0]?.message).toMatch(/at least 2/);
    const twice = createSeriesBody.safeParse({ name: 'Argon', trajectoryIds: [1, 1] });
    expect(twice.error?.issues[0]?.message).toMatch(/twice/);
    expect(createSeriesBody.safeParse({ name: '  ', trajectoryIds: [1, 2] }).error?.issues[0]?.path).toEqual(['name']);
  });

  it('when a patch is empty or mixes the whole list with additions, then it is refused', () => {
    expect(patchSeriesBody.safeParse({}).success).toBe(false);
    const mixed = patchSeriesBody.safeParse({ trajectoryIds: [1, 2], addTrajectoryIds: [3] });
    expect(mixed.error?.issues[0]?.path).toEqual(['trajectoryIds']);
    expect(patchSeriesBody.parse({ members: [{ trajectoryId: 2, excludedFromFit: true }] })).toEqual({ members: [{ trajectoryId: 2, excludedFromFit: true }] });
  });
});
