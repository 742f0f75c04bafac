/**
 * Ergodic's element colours, derived from a rule rather than copied from a
 * table.
 *
 * Four elements keep the colours chemists expect anywhere (hydrogen white,
 * carbon grey, nitrogen blue, oxygen red), written here in the same space as
 * the rule. Every other element gets its colour from its place in the
 * periodic table, in OKLCH (the cylindrical form of OKLab, B. Ottosson 2020,
 * a perceptually even space, so equal steps look like equal changes):
 *
 * - **hue by group**: the hue circle is cut into 18 slots of 20°, one per
 *   group; group g takes slot 5·(g − 1) mod 18, starting at 127°. So each
 *   group has one hue for all its members, neighbouring groups (the elements
 *   that meet in alloys and salts) are 100° apart, and no two groups share a
 *   hue. The f-block (La–Yb, Ac–No) is spread from 10° by the golden angle
 *   137.5°, by place in its row.
 * - **lightness by period**: L = 0.64 − 0.035·(period − 1), so heavier
 *   elements of a group are darker shades of the same hue.
 * - **chroma by block**: s-block 0.15 and p-block 0.13 (vivid), noble gases
 *   0.07 and d-block 0.08 (muted, metallic), f-block 0.10.
 * - **fit to the screen**: chroma is reduced until the colour lies inside
 *   sRGB; then, if the colour has less than 3:1 contrast (WCAG 2.x, the
 *   level for graphical objects) against the viewer's backdrop, lightness
 *   is lowered in steps of 0.01 until it has.
 */

/** The viewer's stage colour; every derived colour keeps 3:1 contrast against it. */
export const VIEWER_BACKDROP = '#eef2f3';

/** Minimum contrast of a derived colour against the backdrop (WCAG 2.x, non-text graphics). */
export const MIN_BACKDROP_CONTRAST = 3;

export interface Oklch { l: number; c: number; h: number }

/** The trade's convention, kept: H white, C grey, N blue, O red. */
export const CONVENTIONAL_COLOURS: Readonly<Record<number, Oklch>> = {
  1: { l: 0.98, c: 0, h: 0 },
  6: { l: 0.56, c: 0, h: 0 },
  7: { l: 0.5, c: 0.19, h: 262 },
  8: { l: 0.58, c: 0.2, h: 27 },
};

/** Neighbouring groups are this many of the 18 hue slots (20° each) apart: 100°. Coprime with 18, so every group has a slot of its own. */
const HUE_STEP = 5;
/** Where group 1 sits. Searched once over 0–359°: from here no derived colour comes closer than ΔE_OK 0.07 to the four conventional ones. */
const HUE_OFFSET = 127;
const GOLDEN_ANGLE = 137.5;
const F_OFFSET = 10;

/** Hue of periodic-table group 1–18, degrees. */
export function groupHue(group: number): number {
  return (HUE_OFFSET + 20 * ((HUE_STEP * (group - 1)) % 18)) % 360;
}

export interface TablePlace {
  period: number;
  /** 1–18, or null for the f-block. */
  group: number | null;
  block: 's' | 'p' | 'd' | 'f';
  /** 0–13 along an f-block row (La…Yb, Ac…No). */
  fIndex: number | null;
}

/** First atomic number of each period. */
const PERIOD_STARTS = [1, 3, 11, 19, 37, 55, 87, 119];

/** Period, group and block of element `z` (1–118) in the 18-column table with La and Ac in the f-block. */
export function tablePlace(z: number): TablePlace {
  if (!Number.isInteger(z) || z < 1 || z > 118) throw new RangeError(`atomic number ${z} is outside 1–118`);
  const period = PERIOD_STARTS.findIndex((start, i) => z >= start && z < PERIOD_STARTS[i + 1]!) + 1;
  const k = z - PERIOD_STARTS[period - 1]!; // 0-based place in the period
  if (period === 1) return z === 1 ? { period, group: 1, block: 's', fIndex: null } : { period, group: 18, block: 'p', fIndex: null };
  if (period <= 3) {
    if (k < 2) return { period, group: k + 1, block: 's', fIndex: null };
    return { period, group: k + 11, block: 'p', fIndex: null };
  }
  if (period <= 5) {
    if (k < 2) return { period, group: k + 1, block: 's', fIndex: null };
    if (k < 12) return { period, group: k + 1, block: 'd', fIndex: null };
    return { period, group: k + 1, block: 'p', fIndex: null };
  }
  // Periods 6 and 7: two s, fourteen f, ten d, six p.
  if (k < 2) return { period, group: k + 1, block: 's', fIndex: null };
  if (k < 16) return { period, group: null, block: 'f', fIndex: k - 2 };
  if (k < 26) return { period, group: k - 13, block: 'd', fIndex: null };
  return { period, group: k - 13, block: 'p', fIndex: null };
}

const CHROMA = { s: 0.15, p: 0.13, d: 0.08, f: 0.1 } as const;
const NOBLE_GAS_CHROMA = 0.07;

/** The rule's starting point for element `z`, before it is fitted to the screen. */
export function ruleColour(z: number): Oklch {
  const place = tablePlace(z);
  const l = 0.64 - 0.035 * (place.period - 1);
  const h = place.group !== null ? groupHue(place.group) : (F_OFFSET + GOLDEN_ANGLE * place.fIndex!) % 360;
  const c = place.group === 18 ? NOBLE_GAS_CHROMA : CHROMA[place.block];
  return { l, c, h };
}

/**
 * Colour for a species that names no element (a coarse-grained bead, a
 * made-up label): a muted violet at 297°, midway between two group hues, so
 * it is never mistaken for an element.
 */
export function unlistedSpeciesColour(): string {
  return toHex(fitToScreen({ l: 0.6, c: 0.05, h: 297 }));
}

/** Display colour of element `z`, #rrggbb. */
export function elementColour(z: number): string {
  const conventional = CONVENTIONAL_COLOURS[z];
  if (conventional) return toHex(oklchToLinearSrgb(conventional));
  return toHex(fitToScreen(ruleColour(z)));
}

/** Into sRGB by lowering chroma, then dark enough for the backdrop by lowering lightness. */
function fitToScreen(colour: Oklch): [number, number, number] {
  let { l, c } = colour;
  const inGamut = (rgb: number[]) => rgb.every((v) => v >= -1e-9 && v <= 1 + 1e-9);
  for (;;) {
    let rgb = oklchToLinearSrgb({ l, c, h: colour.h });
    while (!inGamut(rgb) && c > 0) {
      c = Math.max(0, c - 0.002);
      rgb = oklchToLinearSrgb({ l, c, h: colour.h });
    }
    const clamped = rgb.map((v) => Math.min(1, Math.max(0, v))) as [number, number, number];
    if (contrastRatio(toHex(clamped), VIEWER_BACKDROP) >= MIN_BACKDROP_CONTRAST || l <= 0.2) return clamped;
    l -= 0.01;
  }
}

/** OKLCH to linear-light sRGB (Ottosson's published OKLab matrices). */
export function oklchToLinearSrgb({ l, c, h }: Oklch): [number, number, number] {
  const a = c * Math.cos((h * Math.PI) / 180);
  const b = c * Math.sin((h * Math.PI) / 180);
  const l_ = (l + 0.3963377774 * a + 0.2158037573 * b) ** 3;
  const m_ = (l - 0.1055613458 * a - 0.0638541728 * b) ** 3;
  const s_ = (l - 0.0894841775 * a - 1.291485548 * b) ** 3;
  return [
    4.0767416621 * l_ - 3.3077115913 * m_ + 0.2309699292 * s_,
    -1.2684380046 * l_ + 2.6097574011 * m_ - 0.3413193965 * s_,
    -0.0041960863 * l_ - 0.7034186147 * m_ + 1.707614701 * s_,
  ];
}

/** sRGB transfer function (IEC 61966-2-1). */
const encode = (v: number) => (v <= 0.0031308 ? 12.92 * v : 1.055 * v ** (1 / 2.4) - 0.055);
const decode = (v: number) => (v <= 0.04045 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4);

function toHex(linear: readonly number[]): string {
  return `#${linear.map((v) => Math.round(encode(Math.min(1, Math.max(0, v))) * 255).toString(16).padStart(2, '0')).join('')}`;
}

/** WCAG 2.x relative luminance of #rrggbb. */
export function relativeLuminance(hex: string): number {
  const [r, g, b] = [1, 3, 5].map((i) => decode(parseInt(hex.slice(i, i + 2), 16) / 255));
  return 0.2126 * r! + 0.7152 * g! + 0.0722 * b!;
}

/** WCAG 2.x contrast ratio between two #rrggbb colours, 1–21. */
export function contrastRatio(a: string, b: string): number {
  const [hi, lo] = [relativeLuminance(a), relativeLuminance(b)].sort((x, y) => y - x);
  return (hi! + 0.05) / (lo! + 0.05);
}

/** Inverse of `oklchToLinearSrgb` via OKLab, for checks on distinctness. */
export function hexToOklab(hex: string): { l: number; a: number; b: number } {
  const [r, g, bl] = [1, 3, 5].map((i) => decode(parseInt(hex.slice(i, i + 2), 16) / 255)) as [number, number, number];
  const l = Math.cbrt(0.4122214708 * r + 0.5363026619 * g + 0.0514459929 * bl);
  const m = Math.cbrt(0.2119034982 * r + 0.6806995451 * g + 0.1073969566 * bl);
  const s = Math.cbrt(0.0883024619 * r + 0.2817188376 * g + 0.6299787005 * bl);
  return {
    l: 0.2104542553 * l + 0.793617785 * m - 0.0040720468 * s,
    a: 1.9779984951 * l - 2.428592205 * m + 0.4505937099 * s,
    b: 0.0259040371 * l + 0.7827717662 * m - 0.808675766 * s,
  };
}
