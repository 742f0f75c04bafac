/**
 * Element data shared by the engine and the browser.
 *
 * Masses: IUPAC 2021 abridged / conventional standard atomic weights
 * (Prohaska et al., Pure Appl. Chem. 94, 573 (2022), "Standard atomic weights
 * of the elements 2021"), in u. Where IUPAC gives an interval the conventional
 * value is used. Values typed from memory of that table; a user can override
 * any mass per run (isotopes, united atoms, coarse-grained beads).
 *
 * Covalent radii: B. Cordero et al., "Covalent radii revisited", Dalton Trans.
 * 2008, 2832–2838, in Å (C is the sp³ value; Mn, Fe, Co are low-spin).
 *
 * Colours: Ergodic's own shades, following only the general chemistry habit
 * (H white, C grey, N blue, O red, S yellow, halogens green…).
 */

export interface ElementData {
  symbol: string;
  atomicNumber: number;
  /** Standard atomic weight, u. */
  massU: number;
  /** Covalent radius, Å. */
  covalentRadiusA: number;
  /** Display colour, #rrggbb. */
  colour: string;
}

type Row = [symbol: string, z: number, mass: number, radius: number, colour: string];

const ROWS: readonly Row[] = [
  ['H', 1, 1.008, 0.31, '#f4f4f0'],
  ['He', 2, 4.0026, 0.28, '#c9f0ee'],
  ['Li', 3, 6.94, 1.28, '#b87fe0'],
  ['Be', 4, 9.0122, 0.96, '#b9e07a'],
  ['B', 5, 10.81, 0.84, '#e9b3a8'],
  ['C', 6, 12.011, 0.76, '#8a8d91'],
  ['N', 7, 14.007, 0.71, '#3d5fd9'],
  ['O', 8, 15.999, 0.66, '#e0392b'],
  ['F', 9, 18.998, 0.57, '#93d96a'],
  ['Ne', 10, 20.18, 0.58, '#aee0ee'],
  ['Na', 11, 22.99, 1.66, '#a466e3'],
  ['Mg', 12, 24.305, 1.41, '#7fe05a'],
  ['Al', 13, 26.982, 1.21, '#bfa6a8'],
  ['Si', 14, 28.085, 1.11, '#e6c49a'],
  ['P', 15, 30.974, 1.07, '#f2862b'],
  ['S', 16, 32.06, 1.05, '#f0d93a'],
  ['Cl', 17, 35.45, 1.02, '#2fd62a'],
  ['Ar', 18, 39.95, 1.06, '#7ccfdc'],
  ['K', 19, 39.098, 2.03, '#8a45cc'],
  ['Ca', 20, 40.078, 1.76, '#48e02a'],
  ['Sc', 21, 44.956, 1.7, '#e2e2e0'],
  ['Ti', 22, 47.867, 1.6, '#bcc0c4'],
  ['V', 23, 50.942, 1.53, '#a3a3aa'],
  ['Cr', 24, 51.996, 1.39, '#8a97c4'],
  ['Mn', 25, 54.938, 1.39, '#9a7ac4'],
  ['Fe', 26, 55.845, 1.32, '#de6a36'],
  ['Co', 27, 58.933, 1.26, '#ee8fa0'],
  ['Ni', 28, 58.693, 1.24, '#55cf55'],
  ['Cu', 29, 63.546, 1.32, '#c98248'],
  ['Zn', 30, 65.38, 1.22, '#7c82ad'],
  ['Ga', 31, 69.723, 1.22, '#c59090'],
  ['Ge', 32, 72.63, 1.2, '#6a9090'],
  ['As', 33, 74.922, 1.19, '#be82e0'],
  ['Se', 34, 78.971, 1.2, '#ffa31a'],
  ['Br', 35, 79.904, 1.2, '#a82a2a'],
  ['Kr', 36, 83.798, 1.16, '#5cb8d1'],
  ['Pd', 46, 106.42, 1.39, '#0a6f85'],
  ['Ag', 47, 107.87, 1.45, '#c6c9cc'],
  ['Sn', 50, 118.71, 1.39, '#678087'],
  ['I', 53, 126.9, 1.39, '#960096'],
  ['Xe', 54, 131.29, 1.4, '#44a0b4'],
  ['W', 74, 183.84, 1.62, '#2f95d9'],
  ['Pt', 78, 195.08, 1.36, '#d2d2e0'],
  ['Au', 79, 196.97, 1.36, '#f5c623'],
  ['Pb', 82, 207.2, 1.46, '#58595f'],
];

export const ELEMENTS: ReadonlyMap<string, ElementData> = new Map(
  ROWS.map(([symbol, atomicNumber, massU, covalentRadiusA, colour]) => [
    symbol,
    { symbol, atomicNumber, massU, covalentRadiusA, colour },
  ]),
);

export class UnknownElementError extends Error {
  constructor(readonly label: string) {
    super(`Unknown element "${label}": give a mass for it in the run settings, or rename the species.`);
    this.name = 'UnknownElementError';
  }
}

/**
 * Maps a species label from a trajectory file to an element symbol. Files use
 * labels such as "Ar1", "ar", "OW" or "Na+": leading letters are tried as a
 * two-letter then a one-letter symbol, case-insensitively.
 */
export function elementSymbolOf(label: string): string {
  const letters = /^[A-Za-z]+/.exec(label.trim())?.[0] ?? '';
  const candidates = [letters.slice(0, 2), letters.slice(0, 1)].filter((c) => c.length > 0);
  // A label that is exactly a one-letter symbol plus a lower-case tail ("Os"?) is
  // ambiguous; an exact full match is preferred before falling back to prefixes.
  const whole = normaliseSymbol(letters);
  if (ELEMENTS.has(whole)) return whole;
  for (const c of candidates) {
    const s = normaliseSymbol(c);
    if (ELEMENTS.has(s)) return s;
  }
  throw new UnknownElementError(label);
}

function normaliseSymbol(s: string): string {
  return s.length === 0 ? s : s[0].toUpperCase() + s.slice(1).toLowerCase();
}

export function elementOf(label: string): ElementData {
  const data = ELEMENTS.get(elementSymbolOf(label));
  if (!data) throw new UnknownElementError(label);
  return data;
}

/**
 * Mass for a species label, in u. A user-given mass for the exact label wins,
 * then one for its element symbol, then the standard atomic weight.
 */
export function massOf(label: string, overrides?: Readonly<Record<string, number>>): number {
  const direct = overrides?.[label];
  if (direct !== undefined) return checkMass(label, direct);
  if (overrides) {
    try {
      const bySymbol = overrides[elementSymbolOf(label)];
      if (bySymbol !== undefined) return checkMass(label, bySymbol);
    } catch {
      // unknown element with no override for the label: reported below
    }
  }
  return elementOf(label).massU;
}

function checkMass(label: string, mass: number): number {
  if (!(mass > 0) || !Number.isFinite(mass)) throw new Error(`Mass for "${label}" must be a positive number of u.`);
  return mass;
}
