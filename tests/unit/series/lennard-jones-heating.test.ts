import { describe, expect, it } from 'vitest';
import { blockAverage } from '../../../server/analysis/block-average.ts';
import { seriesResults } from '../../../server/analysis/series/series-results.ts';
import { simulateLennardJones } from '../../../server/simulate/lennard-jones.ts';
import { memberFromRun } from './series-fixtures.ts';

/**
 * A short heating series from the repo's own Lennard-Jones integrator: argon-like atoms
 * (σ = 3.405 Å, ε/k_B = 119.8 K) at ρ* = 0.95, each run started from a perfect FCC crystal
 * and held at its temperature. Below melting the crystal survives (superheated as SCIENCE
 * item 31 warns); above it the box melts. The signatures of item 31 must change together:
 * D jumps from zero, the Lindemann ratio passes the criterion, the first g(r) minimum fills in.
 */
function heatedRun(temperatureK: number, id: number) {
  const run = simulateLennardJones({
    cellsPerSide: 4, reducedDensity: 0.95, temperatureK, equilibrationSteps: 1000, productionSteps: 2000, sampleEvery: 10, seed: 40 + id,
  });
  const n = run.trajectory.nAtoms;
  const total = blockAverage(run.potentialEV.map((pe, f) => (pe + run.kineticEV[f]!) / n));
  return memberFromRun(id, temperatureK, run.trajectory, { eV: total.mean, stdError: total.stdError, kind: 'total' });
}

describe('a Lennard-Jones heating series around melting (SCIENCE item 31)', () => {
  const members = [100, 130, 170, 200].map((t, i) => heatedRun(t, i + 1));
  const results = seriesResults(members);
  const [cold, warm, melted, hot] = results.members;

  it('when the crystal is heated past its stability limit, then the two cold runs are solid, the two hot ones liquid, and melting is bracketed between 130 K and 170 K', () => {
    expect(results.members.map((m) => m.phase.phase)).toEqual(['solid', 'solid', 'liquid', 'liquid']);
    expect(results.melting.brackets[0]).toMatchObject({ below: { trajectoryId: 2 }, above: { trajectoryId: 3 }, overlap: false });
  });

  it('when it melts, then D jumps from zero within error to a liquid value', () => {
    for (const solid of [cold!, warm!]) expect(solid.phase.evidence[0]!.verdict).toBe('solid');
    for (const liquid of [melted!, hot!]) expect(liquid.d!.a2PerPs).toBeGreaterThan(0.1);
    expect(hot!.d!.a2PerPs).toBeGreaterThan(melted!.d!.a2PerPs);
  });

  it('when it melts, then the Lindemann ratio jumps past the criterion', () => {
    expect(warm!.lindemannRatio!).toBeLessThan(0.2);
    expect(melted!.lindemannRatio!).toBeGreaterThan(0.3);
    expect(melted!.lindemannRatio!).toBeGreaterThan(2.5 * warm!.lindemannRatio!);
  });

  it('when it melts, then g(r) loses its deep first minimum and its first peak drops', () => {
    expect(warm!.rdfShape!.minToPeakRatio!).toBeLessThan(0.14);
    expect(melted!.rdfShape!.minToPeakRatio!).toBeGreaterThan(0.14);
    expect(melted!.rdfShape!.firstPeak.g).toBeLessThan(warm!.rdfShape!.firstPeak.g);
  });

  it('when the runs carry total energies, then the caloric curve jumps up at melting by more than its error, and the solid\'s dE/dT is near 3 k_B per atom', () => {
    expect(results.caloric.energyKind).toBe('total');
    const latent = results.caloric.latentHeat!;
    expect(latent.eVPerAtom).toBeGreaterThan(3 * latent.stdErrorEVPerAtom!);
    const solidSlope = results.heatCapacity.find((p) => p.source === 'slope' && p.trajectoryIds.join() === '1,2')!;
    // Classical harmonic crystal: 3 k_B per atom (Dulong–Petit, SCIENCE items 16 and 28); anharmonicity near melting adds a little.
    expect(solidSlope.perAtomKB).toBeGreaterThan(2.6);
    expect(solidSlope.perAtomKB).toBeLessThan(4);
    expect(results.heatCapacity.find((p) => p.trajectoryIds.join() === '2,3')!.acrossTransition).toBe(true);
  });
});
