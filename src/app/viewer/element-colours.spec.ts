import { describe, expect, it } from 'vitest';
import { contrastRatio, elementColour, hexToOklab, MIN_BACKDROP_CONTRAST, tablePlace, unlistedSpeciesColour } from '../../../shared/element-colour';
import { ELEMENTS } from '../../../shared/elements';
import { STAGE_COLOURS } from './scene/stage-style';

const CONVENTIONAL = [1, 6, 7, 8];
const ALL = Array.from({ length: 118 }, (_, i) => i + 1);
const DERIVED = ALL.filter((z) => !CONVENTIONAL.includes(z));

function lch(hex: string) {
  const { l, a, b } = hexToOklab(hex);
  return { l, c: Math.hypot(a, b), h: ((Math.atan2(b, a) * 180) / Math.PI + 360) % 360 };
}
const distance = (x: string, y: string) => {
  const p = hexToOklab(x), q = hexToOklab(y);
  return Math.hypot(p.l - q.l, p.a - q.a, p.b - q.b);
};
const hueGap = (a: number, b: number) => Math.min(Math.abs(a - b), 360 - Math.abs(a - b));

describe('element colours', () => {
  it('when H, C, N and O are drawn, then they keep the trade’s convention: white, grey, blue, red', () => {
    const [h, c, n, o] = CONVENTIONAL.map((z) => lch(elementColour(z)));
    expect(h!.l).toBeGreaterThan(0.95);
    expect(h!.c).toBeLessThan(0.01);
    expect(c!.c).toBeLessThan(0.01);
    expect(c!.l).toBeGreaterThan(0.4);
    expect(c!.l).toBeLessThan(0.7);
    expect(n!.c).toBeGreaterThan(0.12);
    expect(hueGap(n!.h, 262)).toBeLessThan(15);
    expect(o!.c).toBeGreaterThan(0.12);
    expect(hueGap(o!.h, 27)).toBeLessThan(15);
  });

  it('when any other element is drawn on the viewer’s backdrop, then it has at least 3:1 contrast (WCAG 2.x level for graphical objects)', () => {
    for (const z of DERIVED) {
      expect(contrastRatio(elementColour(z), STAGE_COLOURS.background), `Z = ${z}`).toBeGreaterThanOrEqual(MIN_BACKDROP_CONTRAST);
    }
  });

  it('when elements share a group, then they share a hue and heavier ones are darker', () => {
    const byGroup = new Map<number, number[]>();
    for (const z of DERIVED) {
      const { group } = tablePlace(z);
      if (group !== null) byGroup.set(group, [...(byGroup.get(group) ?? []), z]);
    }
    for (const [group, members] of byGroup) {
      const colours = members.map((z) => lch(elementColour(z)));
      for (let i = 1; i < colours.length; i++) {
        expect(colours[i]!.l, `group ${group}, Z = ${members[i]}`).toBeLessThan(colours[i - 1]!.l);
        // Gamut fitting lowers chroma at constant hue; 8-bit rounding moves the hue by a few degrees at most.
        if (colours[i]!.c > 0.03) expect(hueGap(colours[i]!.h, colours[0]!.h), `group ${group}, Z = ${members[i]}`).toBeLessThan(8);
      }
    }
  });

  it('when two elements of one period are drawn, then they can be told apart (ΔE in OKLab ≥ 0.025, about one just-noticeable difference [FROM MEMORY])', () => {
    const outsideF = ALL.filter((z) => tablePlace(z).block !== 'f');
    for (const z of outsideF) {
      for (const w of outsideF) {
        if (z < w && tablePlace(z).period === tablePlace(w).period) {
          expect(distance(elementColour(z), elementColour(w)), `Z = ${z} and ${w}`).toBeGreaterThanOrEqual(0.025);
        }
      }
    }
  });

  it('when an element is not H, C, N or O, then it does not look like one of them (ΔE in OKLab ≥ 0.07)', () => {
    for (const z of DERIVED.filter((x) => tablePlace(x).block !== 'f')) {
      for (const c of CONVENTIONAL) expect(distance(elementColour(z), elementColour(c)), `Z = ${z} against Z = ${c}`).toBeGreaterThanOrEqual(0.07);
    }
  });

  it('when a species names no element, then its stand-in colour has the same contrast and looks like no element', () => {
    const unlisted = unlistedSpeciesColour();
    expect(contrastRatio(unlisted, STAGE_COLOURS.background)).toBeGreaterThanOrEqual(MIN_BACKDROP_CONTRAST);
    for (const e of ELEMENTS.values()) expect(distance(unlisted, e.colour), e.symbol).toBeGreaterThanOrEqual(0.025);
  });

  it('when the element table is read, then its colours are the rule’s', () => {
    for (const e of ELEMENTS.values()) expect(e.colour).toBe(elementColour(e.atomicNumber));
  });

  it('when places in the periodic table are worked out from Z, then they match the 18-column table', () => {
    expect(tablePlace(2)).toMatchObject({ period: 1, group: 18 });
    expect(tablePlace(5)).toMatchObject({ period: 2, group: 13, block: 'p' });
    expect(tablePlace(26)).toMatchObject({ period: 4, group: 8, block: 'd' });
    expect(tablePlace(54)).toMatchObject({ period: 5, group: 18 });
    expect(tablePlace(57)).toMatchObject({ period: 6, group: null, block: 'f', fIndex: 0 });
    expect(tablePlace(71)).toMatchObject({ period: 6, group: 3, block: 'd' });
    expect(tablePlace(79)).toMatchObject({ period: 6, group: 11 });
    expect(tablePlace(118)).toMatchObject({ period: 7, group: 18 });
    expect(() => tablePlace(0)).toThrow(/outside 1–118/);
  });
});
