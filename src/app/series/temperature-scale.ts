/**
 * Ergodic's own sequential scale for temperature: members are coloured from
 * cold to hot along a path written here, not taken from any table.
 *
 * The rule: start and end are chosen in OKLCH (Ottosson's 2020 perceptual
 * space) — cold is a deep lagoon blue, hot a brick orange, both kin to the
 * app's palette. Lightness rises in equal steps from cold to hot, so the
 * order reads even without hue (grey print, colour-blind readers); hue turns
 * the long way round through moss and ochre, so neighbours differ in hue as
 * well; chroma stays at the level both ends share. A colour outside sRGB
 * keeps its lightness and hue and loses chroma until it fits. Both ends are
 * dark enough that every step keeps at least 3:1 contrast against the white
 * chart background (WCAG 2.1, 1.4.11, non-text contrast).
 */

interface Oklch { l: number; c: number; h: number }

const COLD: Oklch = { l: 0.34, c: 0.1, h: 248 };
const HOT: Oklch = { l: 0.6, c: 0.15, h: 38 };
/** Hue turns downward from cold to hot (248° → 38°, 210° through green and yellow), never through violet. */
const HUE_TURN = -((COLD.h - HOT.h + 360) % 360);

/** The colour for a position t in [0, 1] along the scale, as #rrggbb. */
export function scaleColour(t: number): string {
  const s = Math.min(1, Math.max(0, Number.isFinite(t) ? t : 0));
  const l = COLD.l + (HOT.l - COLD.l) * s;
  const h = (COLD.h + HUE_TURN * s + 360) % 360;
  const c = COLD.c + (HOT.c - COLD.c) * s;
  return toHex(fitInGamut({ l, c, h }));
}

/**
 * One colour per temperature: the coldest member at the cold end, the hottest
 * at the hot end, the rest by where their temperature falls between. Members
 * without a temperature get the middle of the scale.
 */
export function temperatureColours(temperaturesK: readonly (number | null)[]): string[] {
  const known = temperaturesK.filter((t): t is number => t !== null && Number.isFinite(t));
  const lo = Math.min(...known), hi = Math.max(...known);
  return temperaturesK.map((t) => {
    if (t === null || !Number.isFinite(t) || known.length === 0) return scaleColour(0.5);
    return scaleColour(hi > lo ? (t - lo) / (hi - lo) : 0.5);
  });
}

/** Linear sRGB channels of an OKLCH colour (Ottosson's published matrices). */
function toLinearRgb({ l, c, h }: Oklch): [number, number, number] {
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

const inGamut = (rgb: readonly number[]): boolean => rgb.every((v) => v >= -1e-6 && v <= 1 + 1e-6);

/** Halves the chroma step by step (bisection) until the colour is inside sRGB. */
function fitInGamut(colour: Oklch): [number, number, number] {
  const full = toLinearRgb(colour);
  if (inGamut(full)) return full;
  let lo = 0, hi = colour.c;
  for (let i = 0; i < 24; i++) {
    const mid = (lo + hi) / 2;
    if (inGamut(toLinearRgb({ ...colour, c: mid }))) lo = mid;
    else hi = mid;
  }
  return toLinearRgb({ ...colour, c: lo });
}

/** sRGB transfer curve (IEC 61966-2-1). */
function encode(v: number): number {
  const x = Math.min(1, Math.max(0, v));
  return x <= 0.0031308 ? 12.92 * x : 1.055 * x ** (1 / 2.4) - 0.055;
}

function toHex(rgb: readonly number[]): string {
  return `#${rgb.map((v) => Math.round(encode(v) * 255).toString(16).padStart(2, '0')).join('')}`;
}

/** WCAG 2.1 relative luminance of a #rrggbb colour. */
export function relativeLuminance(hex: string): number {
  const channels = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255);
  const [r, g, b] = channels.map((v) => (v <= 0.04045 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4)) as [number, number, number];
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}

/** WCAG 2.1 contrast ratio between two #rrggbb colours. */
export function contrastRatio(a: string, b: string): number {
  const [hi, lo] = [relativeLuminance(a), relativeLuminance(b)].sort((x, y) => y - x) as [number, number];
  return (hi + 0.05) / (lo + 0.05);
}
