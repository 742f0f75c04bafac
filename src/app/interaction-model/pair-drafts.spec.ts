import { describe, expect, it } from 'vitest';
import { INTERACTION_PRESETS } from '../../../shared/interaction-presets';
import { draftIssues, draftModel, emptyPair, fromModel, resolvedDraftPair, toModelInput, type ModelDraft } from './pair-drafts';

describe('interaction-model drafts', () => {
  it('when every preset is loaded into the editor and written back, then the model is unchanged and valid', () => {
    for (const preset of INTERACTION_PRESETS) {
      const draft = fromModel(preset.model);
      expect(draftIssues(draft)).toEqual([]);
      expect(draftModel(draft)!.pairs).toEqual(draftModel(fromModel(toModelInput(draft)))!.pairs);
      const written = toModelInput(draft).pairs[0] as Record<string, unknown>;
      for (const [k, v] of Object.entries(preset.model.pairs[0]!)) expect(written[k]).toEqual(v);
    }
  });

  it('when units are switched to kJ/mol and nm, then the fields are named for them', () => {
    const d = { ...emptyPair('Ar', 'Ar'), energy: 'KJPerMol' as const, length: 'Nm' as const, p1: 0.996, p2: 0.3405, cutoff: 1.2 };
    expect(toModelInput({ name: '', source: '', mixing: 'none', pairs: [d] }).pairs[0]).toMatchObject({ epsilonKJPerMol: 0.996, sigmaNm: 0.3405, cutoffNm: 1.2 });
    const r = resolvedDraftPair(d);
    expect(r?.form === 'lj' && r.sigmaA).toBeCloseTo(3.405, 12);
    expect(r?.cutoffA).toBeCloseTo(12, 12);
  });

  it('when a parameter is missing or negative, or a table line is not two numbers, then the issue names the pair and the field', () => {
    const m: ModelDraft = { name: '', source: '', mixing: 'lorentz-berthelot', pairs: [
      { ...emptyPair('Ar', 'Ar'), p1: 0.01, p2: -3, cutoff: 10 },
      { ...emptyPair('Ne', 'Ne'), p2: 2.8, cutoff: 8 },
      { ...emptyPair('Kr', 'Kr'), form: 'table', csv: 'r,U\n3,1\n4,x', cutoff: 4 },
    ] };
    const issues = draftIssues(m).join('\n');
    expect(issues).toMatch(/pairs\[0\] \(Ar–Ar\)\.sigmaA: must be above 0/);
    expect(issues).toMatch(/pairs\[1\] \(Ne–Ne\)\.epsilon: give ε as exactly one of/);
    expect(issues).toMatch(/pairs\[2\] \(Kr–Kr\)\.points: line 3: expected two numbers/);
    expect(draftModel(m)).toBeNull();
  });
});
