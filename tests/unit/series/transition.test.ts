import { describe, expect, it } from 'vitest';
import { transitionBrackets, type TransitionMember } from '../../../server/analysis/series/transition.ts';
import type { Branch, PhaseName } from '../../../shared/series-results.ts';

const m = (id: number, t: number, phase: PhaseName, branch: Branch | null = null): TransitionMember => ({ trajectoryId: id, label: `run ${id}`, temperatureK: t, phase, branch });

// Melting and boiling signatures and the superheating/supercooling caution: SCIENCE item 31 [COMMON PRACTICE].
describe('melting and boiling brackets', () => {
  it('when solids lie below liquids, then melting is bracketed by the highest solid and the lowest liquid, with the caution', () => {
    const r = transitionBrackets([m(1, 40, 'solid'), m(2, 60, 'solid'), m(3, 90, 'liquid'), m(4, 130, 'liquid')], 'melting');
    expect(r.brackets).toHaveLength(1);
    expect(r.brackets[0]).toMatchObject({ branch: 'all', below: { trajectoryId: 2, temperatureK: 60 }, above: { trajectoryId: 3, temperatureK: 90 }, overlap: false });
    expect(r.brackets[0]!.message).toBe('Between 60 K (highest solid, run 2) and 90 K (lowest liquid, run 3).');
    expect(r.caution).toMatch(/superheating/);
    expect(r.caution).toMatch(/two-phase/);
  });

  it('when a liquid lies below a solid, then the bracket is marked as an overlap and names hysteresis', () => {
    const r = transitionBrackets([m(1, 100, 'solid'), m(2, 85, 'liquid')], 'melting');
    expect(r.brackets[0]!.overlap).toBe(true);
    expect(r.brackets[0]!.message).toMatch(/hysteresis/);
  });

  it('when heating and cooling branches both cross, then each is bracketed and the melting point is bounded by cooling\'s highest solid and heating\'s lowest liquid', () => {
    const r = transitionBrackets([
      m(1, 80, 'solid', 'heating'), m(2, 110, 'solid', 'heating'), m(3, 130, 'liquid', 'heating'),
      m(4, 120, 'liquid', 'cooling'), m(5, 90, 'liquid', 'cooling'), m(6, 70, 'solid', 'cooling'),
    ], 'melting');
    expect(r.brackets.map((b) => [b.branch, b.below?.temperatureK, b.above?.temperatureK])).toEqual([
      ['all', 110, 90], ['heating', 110, 130], ['cooling', 70, 90],
    ]);
    expect(r.brackets[0]!.overlap).toBe(true);
    expect(r.hysteresisBounds).toMatchObject({ lowerK: 70, upperK: 130 });
  });

  it('when liquids give way to a vapour, then boiling is bracketed by the highest liquid and the lowest vapour', () => {
    const r = transitionBrackets([m(1, 40, 'solid'), m(2, 90, 'liquid'), m(3, 130, 'liquid'), m(4, 160, 'vapour')], 'boiling');
    expect(r.brackets[0]).toMatchObject({ below: { temperatureK: 130 }, above: { temperatureK: 160 } });
    expect(r.caution).toMatch(/coexistence/);
  });

  it('when the series has no liquid, then there is nothing to bracket and the message says which phase is missing', () => {
    const r = transitionBrackets([m(1, 40, 'solid'), m(2, 60, 'unclear')], 'melting');
    expect(r.brackets[0]).toMatchObject({ below: { temperatureK: 40 }, above: null });
    expect(r.brackets[0]!.message).toBe('Nothing to bracket: no liquid member.');
  });
});
