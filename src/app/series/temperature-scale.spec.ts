import { describe, expect, it } from 'vitest';
import { contrastRatio, relativeLuminance, scaleColour, temperatureColours } from './temperature-scale';

const STEPS = Array.from({ length: 41 }, (_, i) => scaleColour(i / 40));

describe('the temperature scale', () => {
  it('when read from cold to hot, then every colour is a valid hex colour and luminance rises at every step', () => {
    for (const c of STEPS) expect(c).toMatch(/^#[0-9a-f]{6}$/);
    const y = STEPS.map(relativeLuminance);
    for (let i = 1; i < y.length; i++) expect(y[i]!).toBeGreaterThan(y[i - 1]!);
  });

  it('when drawn on the white chart background, then every step keeps at least 3:1 contrast (WCAG 2.1, 1.4.11)', () => {
    for (const c of STEPS) expect(contrastRatio(c, '#ffffff')).toBeGreaterThanOrEqual(3);
  });

  it('when its two ends are compared, then they differ clearly in luminance (at least 1.8:1 between them)', () => {
    expect(contrastRatio(STEPS[0]!, STEPS[40]!)).toBeGreaterThan(1.8);
  });

  it('when WCAG luminance is computed, then it matches the definition for white, black and mid grey (WCAG 2.1 formula)', () => {
    expect(relativeLuminance('#ffffff')).toBeCloseTo(1, 6);
    expect(relativeLuminance('#000000')).toBeCloseTo(0, 6);
    // #777777: 119/255 = 0.4667 → ((0.4667 + 0.055)/1.055)^2.4 = 0.1845.
    expect(relativeLuminance('#777777')).toBeCloseTo(0.1845, 3);
    expect(contrastRatio('#ffffff', '#000000')).toBeCloseTo(21, 6);
  });

  it('when members are coloured by temperature, then the coldest and hottest take the ends and the order follows temperature', () => {
    const colours = temperatureColours([300, 100, 200, null]);
    expect(colours[1]).toBe(scaleColour(0));
    expect(colours[0]).toBe(scaleColour(1));
    expect(colours[2]).toBe(scaleColour(0.5));
    expect(colours[3]).toBe(scaleColour(0.5));
  });

  it('when every member has the same temperature or none has one, then all take the middle colour', () => {
    expect(new Set(temperatureColours([250, 250]))).toEqual(new Set([scaleColour(0.5)]));
    expect(temperatureColours([null, null])).toEqual([scaleColour(0.5), scaleColour(0.5)]);
  });
});
