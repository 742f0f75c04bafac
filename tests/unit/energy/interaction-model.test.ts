import { describe, expect, it } from 'vitest';
import { ENERGY_SUFFIXES } from '../../../shared/energy-units.ts';
import { interactionModelSchema, parseInteractionModel, parseTableCsv, resolvePair, resolvePairsFor } from '../../../shared/interaction-model.ts';
import { forceShiftOf, pairEvaluator, shiftOf, tailIntegral } from '../../../shared/pair-functions.ts';

describe('the interaction model schema', () => {
  it('when the command-line form is given exactly as documented, then it is LJ, truncated, unshifted and without tail correction', () => {
    const model = interactionModelSchema.parse({ pairs: [{ species: ['Ar', 'Ar'], form: 'lj', epsilonEV: 0.0103236, sigmaA: 3.405, cutoffA: 10.5 }] });
    const [p] = resolvePairsFor(model, ['Ar', 'Ar']);
    expect(p).toMatchObject({ form: 'lj', epsilonEV: 0.0103236, sigmaA: 3.405, cutoffA: 10.5, truncation: 'truncated', tailCorrection: false, origin: 'given' });
    expect(shiftOf(p)).toBe(0);
  });

  it('when ε is given as ε/k_B = 119.8 K, in kJ/mol or in kcal/mol, then it converts with the exact SI constants (k_B/e, 1000/(N_A e), 4184/(N_A e))', () => {
    const eps = (field: string, value: number) => {
      const m = interactionModelSchema.parse({ pairs: [{ species: ['Ar', 'Ar'], form: 'lj', [field]: value, sigmaNm: 0.3405, cutoffNm: 1.05 }] });
      const p = resolvePair(m.pairs[0]);
      return p.form === 'lj' ? [p.epsilonEV, p.sigmaA, p.cutoffA] : [];
    };
    // 119.8 K × 8.617333262e-5 eV/K = 0.0103235653 eV [DERIVED from the exact k_B and e, SCIENCE item 7]
    expect(eps('epsilonK', 119.8)[0]).toBeCloseTo(0.0103235653, 9);
    expect(eps('epsilonKJPerMol', 96.485332)[0]).toBeCloseTo(1, 6); // 1 eV = 96.485332 kJ/mol [DERIVED]
    expect(eps('epsilonKcalPerMol', 23.060548)[0]).toBeCloseTo(1, 6); // 1 eV = 23.060548 kcal/mol [DERIVED]
    expect(eps('epsilonK', 1)[1]).toBeCloseTo(3.405, 12);
    expect(eps('epsilonK', 1)[2]).toBeCloseTo(10.5, 12);
    expect(ENERGY_SUFFIXES.K).toBeCloseTo(8.617333262e-5, 14);
  });

  it('when fields are missing, doubled, unitless or out of range, then each message names the field and the pair', () => {
    const bad = parseInteractionModel({ pairs: [
      { species: ['Ar', 'Ar'], form: 'lj', epsilonEV: 0.01, epsilonK: 120, sigmaA: 3.4, cutoffA: 10 },
      { species: ['Ne', 'Ne'], form: 'lj', epsilonEV: 0.003, sigma: 2.8, cutoffA: 8 },
      { species: ['Kr', 'Kr'], form: 'lj', epsilonEV: 0.01, sigmaA: -3, cutoffA: 10 },
      { species: ['Xe', 'Xe'], form: 'spring', k: 1 },
    ] });
    expect(bad.ok).toBe(false);
    const text = bad.ok ? '' : bad.issues.join('\n');
    expect(text).toMatch(/pairs\[0\] \(Ar–Ar\)\.epsilonK: give ε as exactly one of epsilonEV, epsilonKJPerMol, epsilonKcalPerMol, epsilonK \(found epsilonEV and epsilonK\)/);
    expect(text).toMatch(/pairs\[1\] \(Ne–Ne\): unknown field sigma \(lengths carry their unit: sigmaA or sigmaNm\)/);
    expect(text).toMatch(/pairs\[2\] \(Kr–Kr\)\.sigmaA: must be above 0/);
    expect(text).toMatch(/pairs\[3\] \(Xe–Xe\)\.form: form must be one of lj, morse, buckingham, table, none/);
  });

  it('when a pair is given twice (in either order), or a tail correction is asked of a shifted pair, then the model is refused', () => {
    const dup = parseInteractionModel({ pairs: [
      { species: ['Ar', 'Ne'], form: 'none' }, { species: ['Ne', 'Ar'], form: 'none' },
    ] });
    expect(dup.ok ? '' : dup.issues.join()).toMatch(/pairs\[1\] \(Ne–Ar\)\.species: the pair Ne–Ar is already given as pairs\[0\]/);
    const tail = parseInteractionModel({ pairs: [{ species: ['Ar', 'Ar'], form: 'lj', epsilonEV: 0.01, sigmaA: 3.4, cutoffA: 10, truncation: 'shifted', tailCorrection: true }] });
    expect(tail.ok ? '' : tail.issues.join()).toMatch(/tailCorrection: tail corrections belong to a truncated/);
  });

  it('when an unlike LJ pair is not given, then Lorentz–Berthelot mixing supplies σ = (σa+σb)/2 and ε = √(εa·εb), marked as mixed; without LJ like pairs it is an error naming the pair', () => {
    const model = interactionModelSchema.parse({ pairs: [
      { species: ['Ar', 'Ar'], form: 'lj', epsilonEV: 0.0104, sigmaA: 3.40, cutoffA: 10 },
      { species: ['Kr', 'Kr'], form: 'lj', epsilonEV: 0.0140, sigmaA: 3.65, cutoffA: 11, truncation: 'shifted' },
    ] });
    const mixed = resolvePairsFor(model, ['Ar', 'Kr']).find((p) => p.origin === 'mixed')!;
    expect(mixed).toMatchObject({ form: 'lj', species: ['Ar', 'Kr'], cutoffA: 11, truncation: 'shifted' });
    if (mixed.form !== 'lj') throw new Error('not LJ');
    expect(mixed.sigmaA).toBeCloseTo(3.525, 12);
    expect(mixed.epsilonEV).toBeCloseTo(Math.sqrt(0.0104 * 0.014), 14);
    const noMix = interactionModelSchema.parse({ ...model, mixing: 'none' });
    expect(() => resolvePairsFor(noMix, ['Ar', 'Kr'])).toThrow(/no potential for Ar–Kr/);
  });

  it('when a table samples LJ finely, then the spline gives U and dU/dr of the analytic form to 1e-6 relative', () => {
    const lj = pairEvaluator({ form: 'lj', epsilonEV: 0.0103, sigmaA: 3.405, cutoffA: 10, truncation: 'truncated', tailCorrection: false, origin: 'given', species: ['Ar', 'Ar'] });
    const out = new Float64Array(2);
    const rows: string[] = ['r_A,U_eV'];
    for (let r = 3; r <= 10.0001; r += 0.01) {
      lj(r, out);
      rows.push(`${r.toFixed(4)},${out[0]}`);
    }
    const csv = parseTableCsv(rows.join('\n'));
    if (!csv.ok) throw new Error(csv.issue);
    const model = interactionModelSchema.parse({ pairs: [{ species: ['Ar', 'Ar'], form: 'table', energyUnit: 'eV', points: csv.points, cutoffA: 10 }] });
    const table = pairEvaluator(resolvePair(model.pairs[0]));
    const t = new Float64Array(2);
    for (const r of [3.3, 3.82, 4.5, 6.123, 9.7]) {
      lj(r, out);
      table(r, t);
      expect(Math.abs(t[0] - out[0])).toBeLessThan(1e-6 * 0.0103);
      expect(Math.abs(t[1] - out[1])).toBeLessThan(1e-5 * 0.0103);
    }
    expect(parseTableCsv('r,U\n1,2\n2,x')).toEqual({ ok: false, issue: 'line 3: expected two numbers "r, U", got "2,x"' });
  });

  it('when Morse and Buckingham are evaluated, then dU/dr matches a central difference and the closed-form tail integrals match numerical quadrature', () => {
    const pairs = [
      resolvePair(interactionModelSchema.parse({ pairs: [{ species: ['Cu', 'Cu'], form: 'morse', depthEV: 0.3429, alphaPerA: 1.3588, r0A: 2.866, cutoffA: 9, tailCorrection: true }] }).pairs[0]),
      resolvePair(interactionModelSchema.parse({ pairs: [{ species: ['O', 'O'], form: 'buckingham', aEV: 22764, rhoA: 0.149, cEVA6: 27.88, cutoffA: 10, tailCorrection: true }] }).pairs[0]),
      resolvePair(interactionModelSchema.parse({ pairs: [{ species: ['Ar', 'Ar'], form: 'lj', epsilonK: 119.8, sigmaA: 3.405, cutoffA: 8.5, tailCorrection: true }] }).pairs[0]),
    ];
    const out = new Float64Array(2), a = new Float64Array(2), b = new Float64Array(2);
    for (const p of pairs) {
      const f = pairEvaluator(p);
      for (const r of [2.5, 3.1, 4.7, 7.9]) {
        f(r, out);
        f(r + 1e-6, a);
        f(r - 1e-6, b);
        expect(Math.abs(out[1] - (a[0] - b[0]) / 2e-6)).toBeLessThan(1e-6 * Math.max(1, Math.abs(out[1])));
      }
      // ∫_rc^∞ r²U dr by the midpoint rule on r = rc/t, t ∈ (0, 1].
      let sum = 0;
      const n = 200_000;
      for (let k = 0; k < n; k++) {
        const t = (k + 0.5) / n, r = p.cutoffA / t;
        f(r, out);
        sum += r * r * out[0] * (p.cutoffA / (t * t)) / n;
      }
      expect(Math.abs(tailIntegral(p) - sum)).toBeLessThan(1e-6 * Math.abs(sum));
    }
  });

  it('when a pair is force-shifted, then both U and dU/dr vanish at the cut-off', () => {
    const p = resolvePair(interactionModelSchema.parse({ pairs: [{ species: ['Ar', 'Ar'], form: 'lj', epsilonK: 119.8, sigmaA: 3.405, cutoffA: 8.5, truncation: 'force-shifted' }] }).pairs[0]);
    const out = new Float64Array(2);
    pairEvaluator(p)(8.5, out);
    expect(out[0] - shiftOf(p)).toBe(0);
    expect(out[1] - forceShiftOf(p)).toBe(0);
    expect(forceShiftOf(p)).toBeGreaterThan(0);
  });
});

describe('hostile interaction models', () => {
  it('when a table has no points, points of the wrong shape, or numbers that are not finite, then each is refused with its field named and nothing throws', () => {
    const cases: unknown[] = [
      { pairs: [{ species: ['Ar', 'Ar'], form: 'table', energyUnit: 'eV', points: [], cutoffA: 5 }] },
      { pairs: [{ species: ['Ar', 'Ar'], form: 'table', energyUnit: 'eV', points: [[1, 2, 3]], cutoffA: 5 }] },
      { pairs: [{ species: ['Ar', 'Ar'], form: 'lj', epsilonEV: Infinity, sigmaA: 3, cutoffA: 5 }] },
      { pairs: [{ species: ['Ar'], form: 'lj', epsilonEV: 1, sigmaA: 3, cutoffA: 5 }] },
      { pairs: 'many' },
      null,
      { pairs: [{ species: ['Ar', 'Ar'], form: 'lj', epsilonEV: 1, sigmaA: 3, cutoffA: 500 }] },
    ];
    for (const input of cases) {
      const r = parseInteractionModel(input);
      expect(r.ok).toBe(false);
      if (!r.ok) expect(r.issues.every((m) => /: /.test(m))).toBe(true);
    }
    const far = parseInteractionModel(cases[6]);
    expect(far.ok ? '' : far.issues.join()).toMatch(/cutoffA: the cut-off must be at most 60 Å/);
  });
});
