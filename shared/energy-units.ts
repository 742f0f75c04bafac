/**
 * Energy and length units an interaction model may be written in, and their
 * factors to the model's working units (eV, Å). The factors come from the
 * exact SI-2019 constants (CODATA 2018), so the browser and the engine agree
 * to the last digit.
 */

const ELEMENTARY_CHARGE_C = 1.602176634e-19;
const AVOGADRO_PER_MOL = 6.02214076e23;
const BOLTZMANN_J_PER_K = 1.380649e-23;
/** Thermochemical calorie, exactly 4.184 J. */
const JOULE_PER_CALORIE = 4.184;

/** Field-name suffix → eV per unit. "K" means an energy given as E/k_B in kelvin. */
export const ENERGY_SUFFIXES = {
  EV: 1,
  KJPerMol: 1000 / (AVOGADRO_PER_MOL * ELEMENTARY_CHARGE_C),
  KcalPerMol: (1000 * JOULE_PER_CALORIE) / (AVOGADRO_PER_MOL * ELEMENTARY_CHARGE_C),
  K: BOLTZMANN_J_PER_K / ELEMENTARY_CHARGE_C,
} as const;
export type EnergySuffix = keyof typeof ENERGY_SUFFIXES;
export const ENERGY_SUFFIX_LIST = Object.keys(ENERGY_SUFFIXES) as EnergySuffix[];

/** Field-name suffix → Å per unit. */
export const LENGTH_SUFFIXES = { A: 1, Nm: 10 } as const;
export type LengthSuffix = keyof typeof LENGTH_SUFFIXES;
export const LENGTH_SUFFIX_LIST = Object.keys(LENGTH_SUFFIXES) as LengthSuffix[];

/** Energy units as people write them (tabulated potentials, file quantities) → eV per unit. */
export const ENERGY_UNITS = {
  eV: ENERGY_SUFFIXES.EV,
  'kJ/mol': ENERGY_SUFFIXES.KJPerMol,
  'kcal/mol': ENERGY_SUFFIXES.KcalPerMol,
  K: ENERGY_SUFFIXES.K,
} as const;
export type EnergyUnit = keyof typeof ENERGY_UNITS;
export const ENERGY_UNIT_LIST = Object.keys(ENERGY_UNITS) as EnergyUnit[];

/** What each suffix means on screen. */
export const SUFFIX_LABELS: Record<EnergySuffix | LengthSuffix, string> = {
  EV: 'eV', KJPerMol: 'kJ/mol', KcalPerMol: 'kcal/mol', K: 'K (as E/k_B)', A: 'Å', Nm: 'nm',
};

/** Boltzmann constant in eV/K (exact). */
export const BOLTZMANN_EV_PER_K = ENERGY_SUFFIXES.K;

/** Pressure: bar per eV/Å³ (1 eV/Å³ = 1.602176634e11 Pa). */
export const BAR_PER_EV_PER_A3 = (ELEMENTARY_CHARGE_C / 1e-30) / 1e5;

/** Pressure units a file may state → bar per unit. */
export const PRESSURE_UNITS = {
  bar: 1,
  atm: 1.01325,
  Pa: 1e-5,
  kPa: 1e-2,
  MPa: 10,
  GPa: 1e4,
  'eV/Å³': BAR_PER_EV_PER_A3,
} as const;
export type PressureUnit = keyof typeof PRESSURE_UNITS;
export const PRESSURE_UNIT_LIST = Object.keys(PRESSURE_UNITS) as PressureUnit[];
