/**
 * Which temperature feeds the harmonic heat capacity, entropy and zero-point
 * energy, decided the same way for every caller: the kinetic temperature of
 * the run by default, a temperature chosen for the analysis when given, and
 * the temperature the simulation states (its thermostat target) beside them,
 * with a warning when the kinetic one is more than 5 % away from it — the
 * usual sign of wrong degrees of freedom, masses or velocity units.
 */

export const STATED_TEMPERATURE_TOLERANCE = 0.05;

export interface TemperatureChoice {
  /** The temperature used, K. */
  usedK: number;
  source: 'kinetic' | 'chosen';
  kineticK: number;
  /** What the simulation states, K, or null. */
  statedK: number | null;
  warning: string | null;
}

export function chooseTemperature(kineticK: number, chosenK?: number | null, statedK?: number | null): TemperatureChoice {
  const chosen = chosenK !== undefined && chosenK !== null;
  return {
    usedK: chosen ? chosenK : kineticK,
    source: chosen ? 'chosen' : 'kinetic',
    kineticK,
    statedK: statedK ?? null,
    warning: statedTemperatureWarning(kineticK, statedK),
  };
}

export function statedTemperatureWarning(kineticK: number, statedK?: number | null): string | null {
  if (statedK === undefined || statedK === null || !(statedK > 0) || !Number.isFinite(kineticK)) return null;
  const off = kineticK / statedK - 1;
  if (Math.abs(off) <= STATED_TEMPERATURE_TOLERANCE) return null;
  return `The kinetic temperature ${kineticK.toPrecision(4)} K is ${Math.abs(100 * off).toPrecision(2)} % ${off < 0 ? 'below' : 'above'} ` +
    `the stated ${statedK.toPrecision(4)} K: check the constraints (degrees of freedom), the masses and the velocity unit.`;
}
