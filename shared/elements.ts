import { elementColour } from './element-colour.ts';

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
 * Colours: H, C, N and O in the colours chemists expect; every other element's
 * from Ergodic's own rule over its place in the periodic table
 * (`element-colour.ts`).
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

type Row = [symbol: string, z: number, mass: number, radius: number];

const ROWS: readonly Row[] = [
  ['H', 1, 1.008, 0.31],
  ['He', 2, 4.0026, 0.28],
  ['Li', 3, 6.94, 1.28],
  ['Be', 4, 9.0122, 0.96],
  ['B', 5, 10.81, 0.84],
  ['C', 6, 12.011, 0.76],
  ['N', 7, 14.007, 0.71],
  ['O', 8, 15.999, 0.66],
  ['F', 9, 18.998, 0.57],
  ['Ne', 10, 20.18, 0.58],
  ['Na', 11, 22.99, 1.66],
  ['Mg', 12, 24.305, 1.41],
  ['Al', 13, 26.982, 1.21],
  ['Si', 14, 28.085, 1.11],
  ['P', 15, 30.974, 1.07],
  ['S', 16, 32.06, 1.05],
  ['Cl', 17, 35.45, 1.02],
  ['Ar', 18, 39.95, 1.06],
  ['K', 19, 39.098, 2.03],
  ['Ca', 20, 40.078, 1.76],
  ['Sc', 21, 44.956, 1.7],
  ['Ti', 22, 47.867, 1.6],
  ['V', 23, 50.942, 1.53],
  ['Cr', 24, 51.996, 1.39],
  ['Mn', 25, 54.938, 1.39],
  ['Fe', 26, 55.845, 1.32],
  ['Co', 27, 58.933, 1.26],
  ['Ni', 28, 58.693, 1.24],
  ['Cu', 29, 63.546, 1.32],
  ['Zn', 30, 65.38, 1.22],
  ['Ga', 31, 69.723, 1.22],
  ['Ge', 32, 72.63, 1.2],
  ['As', 33, 74.922, 1.19],
  ['Se', 34, 78.971, 1.2],
  ['Br', 35, 79.904, 1.2],
  ['Kr', 36, 83.798, 1.16],
  ['Pd', 46, 106.42, 1.39],
  ['Ag', 47, 107.87, 1.45],
  ['Sn', 50, 118.71, 1.39],
  ['I', 53, 126.9, 1.39],
  ['Xe', 54, 131.29, 1.4],
  ['W', 74, 183.84, 1.62],
  ['Pt', 78, 195.08, 1.36],
  ['Au', 79, 196.97, 1.36],
  ['Pb', 82, 207.2, 1.46],
];

export const ELEMENTS: ReadonlyMap<string, ElementData> = new Map(
  ROWS.map(([symbol, atomicNumber, massU, covalentRadiusA]) => [
    symbol,
    { symbol, atomicNumber, massU, covalentRadiusA, colour: elementColour(atomicNumber) },
  ]),
);

export class UnknownElementError extends Error {
  constructor(readonly label: string) {
    super(`Unknown element "${label}": no element symbol, case and all, starts the label; confirm its element or give its mass in the trajectory's metadata (or as "masses" in the run settings).`);
    this.name = 'UnknownElementError';
  }
}

/**
 * How a species label maps to an element. Only case-exact symbols count,
 * because files often carry atom names rather than elements: "CA" is the
 * α-carbon of a protein far more often than calcium, "NE" a side-chain
 * nitrogen rather than neon. So:
 * - `exact`: the label is a symbol, case and all ("Ca", "O", "Na");
 * - `assumed`: no symbol itself, but it starts with a case-exact one: two
 *   letters first ("Ar1" → Ar, "Na+" → Na, "Cl-" → Cl), else one
 *   ("CA" → C, "NE" → N, "OW" → O, "C1" → C, "HW2" → H). Listed after
 *   inspection for the user to confirm;
 * - `unknown`: nothing case-exact at its start ("ca", "bead", "1A"): a mass
 *   (or an element) must be given before a mass-weighted analysis runs.
 * A label is never read as a symbol of other case: "CA" is never calcium.
 */
export interface ElementGuess {
  element: string | null;
  massU: number | null;
  status: 'exact' | 'assumed' | 'unknown';
}

export function guessElement(label: string): ElementGuess {
  const trimmed = label.trim();
  const known = (symbol: string, status: 'exact' | 'assumed'): ElementGuess => ({ element: symbol, massU: ELEMENTS.get(symbol)!.massU, status });
  if (ELEMENTS.has(trimmed)) return known(trimmed, 'exact');
  const two = trimmed.slice(0, 2);
  if (/^[A-Z][a-z]$/.test(two) && ELEMENTS.has(two)) return known(two, 'assumed');
  const one = trimmed.slice(0, 1);
  if (/^[A-Z]$/.test(one) && ELEMENTS.has(one)) return known(one, 'assumed');
  return { element: null, massU: null, status: 'unknown' };
}

/** The element symbol a label stands for by the case-exact rule above; throws for a label with none. */
export function elementSymbolOf(label: string): string {
  const { element } = guessElement(label);
  if (element === null) throw new UnknownElementError(label);
  return element;
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
