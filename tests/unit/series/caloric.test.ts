import { describe, expect, it } from 'vitest';
import { caloricCurve, heatCapacityPoints, type CaloricMember } from '../../../server/analysis/series/caloric.ts';
import { transitionBrackets } from '../../../server/analysis/series/transition.ts';
import type { PhaseName } from '../../../shared/series-results.ts';

// k_B = 8.617333262e-5 eV/K and 1 eV per particle = 96.485332 kJ/mol, from the exact SI constants (SCIENCE item 7).
const KB_EV = 8.617333262e-5;
const KJ_PER_EV = 96.48533212;

function member(id: number, t: number, phase: PhaseName, eV: number, stdError: number | null = 1e-4): CaloricMember {
  return {
    trajectoryId: id, label: `run ${id}`, temperatureK: t, temperatureStdError: null, energy: { eV, stdError, kind: 'total' }, phase, branch: null, excluded: false,
    cvFluctuationPerAtomKB: null, cvHarmonicPerAtomKB: null,
  };
}

function series(points: [number, PhaseName, number][]) {
  const members = points.map(([t, p, e], i) => member(i + 1, t, p, e));
  const melting = transitionBrackets(members.map((m) => ({ ...m, branch: null })), 'melting').brackets[0];
  return { members, melting };
}

describe('caloric curve, latent heat and Cv(T)', () => {
  // Exact: E = e0 + c·T on each side with a jump L between the lines [COMMON PRACTICE reading of a caloric curve].
  const cs = 3 * KB_EV, cl = 3.6 * KB_EV, L = 0.01;
  const solidE = (t: number) => -0.09 + cs * t;
  const liquidE = (t: number) => -0.09 + L + cl * (t - 75) + cs * 75;

  it('when two solid and two liquid members lie on straight lines, then the latent heat is the gap between the lines at the bracket middle', () => {
    const { members, melting } = series([[40, 'solid', solidE(40)], [60, 'solid', solidE(60)], [90, 'liquid', liquidE(90)], [120, 'liquid', liquidE(120)]]);
    const curve = caloricCurve(members, melting);
    expect(curve.energyKind).toBe('total');
    const expected = liquidE(75) - solidE(75);
    expect(curve.latentHeat!.atK).toBe(75);
    expect(curve.latentHeat!.eVPerAtom).toBeCloseTo(expected, 12);
    expect(curve.latentHeat!.kJPerMol).toBeCloseTo(expected * KJ_PER_EV, 8);
    expect(curve.latentHeat!.stdErrorEVPerAtom).toBeGreaterThan(0);
  });

  it('when each phase has one member, then only the raw jump is given and called an upper bound', () => {
    const { members, melting } = series([[60, 'solid', solidE(60)], [90, 'liquid', liquidE(90)]]);
    const curve = caloricCurve(members, melting);
    expect(curve.latentHeat!.eVPerAtom).toBeCloseTo(liquidE(90) - solidE(60), 12);
    expect(curve.latentHeat!.method).toMatch(/upper bound/);
  });

  it('when neighbouring members lie on a line of slope c, then Cv from dE/dT is c in k_B per atom, and a slope across melting is marked', () => {
    const { members, melting } = series([[40, 'solid', solidE(40)], [60, 'solid', solidE(60)], [90, 'liquid', liquidE(90)], [120, 'liquid', liquidE(120)]]);
    const cv = heatCapacityPoints(members, caloricCurve(members, melting).energyKind);
    expect(cv.map((p) => [p.temperatureK, Number(p.perAtomKB.toFixed(9)), p.acrossTransition])).toEqual([
      [50, 3, false], [75, Number(((liquidE(90) - solidE(60)) / 30 / KB_EV).toFixed(9)), true], [105, 3.6, false],
    ]);
    // 3 k_B per atom is the Dulong–Petit 3R = 24.943 J/(mol·K) (SCIENCE item 16).
    expect(cv[0]!.jPerMolK).toBeCloseTo(24.943388, 5);
    expect(cv[0]!.stdErrorKB).toBeCloseTo(Math.SQRT2 * 1e-4 / 20 / KB_EV, 9);
  });

  it('when members have only kinetic energies, then the curve says so and gives no latent heat', () => {
    const members = [40, 90].map((t, i) => ({ ...member(i + 1, t, i ? 'liquid' : 'solid', 1.5 * KB_EV * t), energy: { eV: 1.5 * KB_EV * t, stdError: null, kind: 'kinetic' as const } }));
    const curve = caloricCurve(members, transitionBrackets(members, 'melting').brackets[0]);
    expect(curve.energyKind).toBe('kinetic');
    expect(curve.note).toMatch(/Kinetic energy per atom only/);
    expect(curve.latentHeat).toBeNull();
    expect(curve.latentHeatNote).toMatch(/total energies/);
  });

  it('when members carry fluctuation and harmonic heat capacities, then each appears at its own temperature with its source', () => {
    const members = [{ ...member(1, 50, 'solid', -0.08), cvFluctuationPerAtomKB: { value: 3.1, stdError: 0.2 }, cvHarmonicPerAtomKB: 2.9 }];
    const cv = heatCapacityPoints(members, 'total');
    expect(cv.map((p) => [p.source, p.temperatureK, p.perAtomKB])).toEqual([['fluctuation', 50, 3.1], ['harmonic-vdos', 50, 2.9]]);
  });
});
