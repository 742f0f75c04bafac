import { describe, expect, it } from 'vitest';
import { runAnalyses } from '../../../server/analysis/index.ts';
import { rdf } from '../../../server/analysis/rdf.ts';
import { combine, diatomicBox, idealGas, jitteredFcc } from './known-answer-systems.ts';

// SCIENCE item 15 [COMMON PRACTICE]: uniform random points have g(r) = 1 at every r — no coordination shell.
describe('No shell where there is no structure (SCIENCE item 15)', () => {
  it.each([[500, 20, 20, 0.05], [200, 15, 50, 0.02], [1000, 30, 5, 0.1]])('when %i ideal-gas atoms fill a %i Å box over %i frames (bins %f Å), then there is no first peak and no first minimum', (n, box, frames, bin) => {
    const r = rdf(idealGas(n, box, frames, n + frames), { binWidthA: bin });
    expect(r.total.firstPeak).toBeNull();
    expect(r.total.firstMinimum).toBeNull();
  });

  it('when an ideal gas of two species is analysed, then no pair has a shell', () => {
    const gas = combine([idealGas(300, 20, 30, 1, 'Ar'), idealGas(100, 20, 30, 2, 'Ne')]);
    for (const p of [rdf(gas).total, ...rdf(gas).pairs]) expect([p.label, p.firstPeak, p.firstMinimum]).toEqual([p.label, null, null]);
  });

  it('when one random configuration is stored 100 times, then its chance bumps are not taken for a shell (frames are not independent)', () => {
    const once = idealGas(400, 18, 1, 7);
    const frozen = { ...once, nFrames: 100, positions: new Float32Array(100 * once.positions.length).map((_, k) => once.positions[k % once.positions.length]), cells: new Float64Array(900).map((_, k) => once.cells![k % 9]), times: Float64Array.from({ length: 100 }, (_, f) => f) };
    const r = rdf(frozen, { binWidthA: 0.02 });
    expect(r.independentFrames).toBe(1);
    expect(r.total.firstPeak).toBeNull();
  });

  it('when the report is written, then the summary carries nulls for the ideal gas', () => {
    const s = runAnalyses(idealGas(500, 20, 20, 4), ['rdf'], {}).summary.rdf!;
    expect(s.pairs.every((p) => p.firstPeak === null && p.firstMinimum === null)).toBe(true);
  });
});

// SCIENCE item 6: H³⁵Cl bond length as simulated here, 1.275 Å (r_e 1.2746 Å, Huber & Herzberg [FROM MEMORY]).
describe('Shells per species pair', () => {
  const hcl = { speciesA: 'H', speciesB: 'Cl', massA: 1.00782503223, massB: 34.968852682, wavenumberCm1: 2990.946, bondLengthA: 1.275, molecules: 64 };

  it('when 64 HCl molecules fly through a 40 Å box, then H–Cl has exactly one neighbour at 1.275 Å, and H–H and Cl–Cl (no structure) have no shell', () => {
    const box = diatomicBox([hcl], { temperatureK: 300, timeStepPs: 0.001, frames: 200, boxA: 40, seed: 9 });
    const r = rdf(box, { rMaxA: 8 });
    const pair = (label: string) => r.pairs.find((p) => p.label === label)!;
    expect(Math.abs(pair('H-Cl').firstPeak!.rA - 1.275)).toBeLessThanOrEqual(r.binWidthA);
    expect(pair('H-Cl').firstMinimum!.coordination).toBeCloseTo(1, 6);
    expect(r.total.firstMinimum!.coordination).toBeCloseTo(1, 6);
    for (const like of ['H-H', 'Cl-Cl']) expect([pair(like).firstPeak, pair(like).firstMinimum]).toEqual([null, null]);
  });

  it('when the HCl molecules move between frames, then the bonded shell is still found and the like pairs still have none', () => {
    const box = diatomicBox([hcl], { temperatureK: 300, timeStepPs: 0.05, frames: 200, boxA: 40, seed: 10 });
    const r = rdf(box, { rMaxA: 8 });
    expect(r.independentFrames).toBeGreaterThan(10);
    // Chance neighbours of the ideal gas of molecules add ρ_Cl·(4/3)πr³ ≈ 0.014 up to where the shell ends at ~1.5 Å.
    expect(Math.abs(r.pairs.find((p) => p.label === 'H-Cl')!.firstMinimum!.coordination - 1)).toBeLessThan(0.03);
    expect(r.pairs.find((p) => p.label === 'H-H')!.firstPeak).toBeNull();
  });

  it('when a crystal jitters, then its first shell is still found with its 12 neighbours (SCIENCE item 14)', () => {
    const r = rdf(jitteredFcc(4, 5.26, 0.1, 10, 3));
    expect(Math.abs(r.total.firstPeak!.rA - 5.26 / Math.SQRT2)).toBeLessThan(0.05);
    expect(r.total.firstMinimum!.coordination).toBeCloseTo(12, 6);
  });
});
