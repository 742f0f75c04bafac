import { describe, expect, it } from 'vitest';
import { runAnalyses } from '../../../server/analysis/index.ts';
import { simulateLennardJones } from '../../../server/simulate/lennard-jones.ts';

describe('the typed report summary runAnalyses writes', () => {
  const traj = simulateLennardJones({ cellsPerSide: 3, reducedDensity: 0.8442, temperatureK: 86.5, equilibrationSteps: 200, productionSteps: 800, sampleEvery: 2, seed: 11 }).trajectory;
  const run = runAnalyses(traj, ['thermo', 'msd', 'vacf', 'vdos', 'rdf', 'sq', 'lindemann', 'ngp'], { masses: { Ar: 39.948 } });
  const { summary } = run;

  it('when D is reported, then its three units agree: 1 Å²/ps = 10⁻⁸ m²/s = 10⁻⁴ cm²/s', () => {
    const values = [...summary.msd!.groups.flatMap((g) => [g.d, g.dStdError]), ...summary.vacf!.groups.flatMap((g) => [g.dGreenKubo, g.spread])];
    expect(values.filter((v) => v !== null).length).toBeGreaterThan(1);
    for (const v of values) {
      if (!v) continue;
      expect(v.e9M2PerS).toBeCloseTo(v.a2PerPs * 10, 10);
      expect(v.cm2PerS).toBeCloseTo(v.a2PerPs * 1e-4, 14);
    }
  });

  it('when the MSD is fitted, then every group names its window inside the lag range, and the "all" group counts every atom', () => {
    const all = summary.msd!.groups.find((g) => g.label === 'all')!;
    expect(all.atoms).toBe(traj.nAtoms);
    const lastLag = run.curves.msd!.data[0]![run.curves.msd!.data[0]!.length - 1]!;
    for (const g of summary.msd!.groups) {
      expect(g.fitWindowPs.start).toBeGreaterThanOrEqual(0);
      expect(g.fitWindowPs.end).toBeGreaterThan(g.fitWindowPs.start);
      expect(g.fitWindowPs.end).toBeLessThanOrEqual(lastLag + 1e-9);
    }
  });

  it('when the temperature is averaged, then the summary carries the mean with a positive block error and the DOF used (3N − 3)', () => {
    const { temperatureK, degreesOfFreedom } = summary.thermo!;
    expect(degreesOfFreedom).toBe(3 * traj.nAtoms - 3);
    expect(temperatureK.stdError).toBeGreaterThan(0);
    expect(Math.abs(temperatureK.mean - 86.5)).toBeLessThan(30);
  });

  it('when g(r) has a first shell, then its minimum lies beyond its peak and holds a dense-liquid coordination (Lennard-Jones liquid ≈ 12)', () => {
    const all = summary.rdf!.pairs.find((p) => p.label === 'all')!;
    expect(all.firstPeak!.rA).toBeLessThan(all.firstMinimum!.rA);
    expect(all.firstMinimum!.coordination).toBeGreaterThan(9);
    expect(all.firstMinimum!.coordination).toBeLessThan(15);
  });

  it('when heat capacity comes from the VDOS, then the classical value is the modes per atom in k_B (Dulong–Petit) and the quantum one is below it', () => {
    const { cv, modes, peaks } = summary.vdos!;
    expect(cv.classical.perAtomKB).toBeCloseTo(modes / traj.nAtoms, 2);
    expect(cv.quantum.perAtomKB).toBeLessThanOrEqual(cv.classical.perAtomKB);
    expect(peaks.length).toBeGreaterThan(0);
    for (const p of peaks) expect(p.cm1).toBeCloseTo(p.thz * 33.35641, 3);
  });

  it('when S(q), Lindemann and α₂ run, then each headline is filled and S(q) has its main peak', () => {
    expect(summary.sq!.firstPeak!.s).toBeGreaterThan(1);
    expect(typeof summary.lindemann!.melted).toBe('boolean');
    expect(summary.lindemann!.index).toBeGreaterThan(0);
    expect(summary.ngp!.peakLagPs).not.toBeNull();
  });
});
