/**
 * Physical constants, CODATA 2018 recommended values (exact where the 2019 SI
 * fixes them). Each is defined once here; everything else derives from them.
 * Engine units: length Å, time ps, mass u (dalton), temperature K.
 */

/** Boltzmann constant, J/K (exact). */
export const BOLTZMANN_J_PER_K = 1.380649e-23;
/** Planck constant, J·s (exact). */
export const PLANCK_J_S = 6.62607015e-34;
/** Reduced Planck constant, J·s. */
export const HBAR_J_S = PLANCK_J_S / (2 * Math.PI);
/** Avogadro constant, 1/mol (exact). */
export const AVOGADRO_PER_MOL = 6.02214076e23;
/** Molar gas constant R = N_A·k_B, J/(mol·K). */
export const GAS_CONSTANT_J_PER_MOL_K = AVOGADRO_PER_MOL * BOLTZMANN_J_PER_K;
/** Speed of light in vacuum, m/s (exact). */
export const SPEED_OF_LIGHT_M_PER_S = 299_792_458;
/** Elementary charge, C (exact); also J per eV. */
export const ELEMENTARY_CHARGE_C = 1.602176634e-19;
/** Atomic mass constant (1 u), kg. */
export const ATOMIC_MASS_UNIT_KG = 1.6605390666e-27;
/** Bohr radius, m. */
export const BOHR_RADIUS_M = 5.29177210903e-11;

/** Metres per ångström and seconds per picosecond (definitions). */
export const METRE_PER_ANGSTROM = 1e-10;
export const SECOND_PER_PS = 1e-12;

/** Boltzmann constant in engine units, u·Å²/(ps²·K) (≈ 0.831446). */
export const BOLTZMANN_ENGINE =
  BOLTZMANN_J_PER_K / (ATOMIC_MASS_UNIT_KG * (METRE_PER_ANGSTROM / SECOND_PER_PS) ** 2);

/** One engine energy unit (u·Å²/ps²) in joules. */
export const JOULE_PER_ENGINE_ENERGY =
  ATOMIC_MASS_UNIT_KG * (METRE_PER_ANGSTROM / SECOND_PER_PS) ** 2;

/** Bohr radius in Å. */
export const ANGSTROM_PER_BOHR = BOHR_RADIUS_M / METRE_PER_ANGSTROM;

/** Grams per atomic mass unit. */
export const GRAM_PER_AMU = ATOMIC_MASS_UNIT_KG * 1e3;
/** Cubic centimetres per cubic ångström. */
export const CM3_PER_A3 = 1e-24;
/** Square centimetres per square ångström and m² per Å². */
export const CM2_PER_A2 = 1e-16;
export const M2_PER_A2 = 1e-20;
/** Wavenumber (cm⁻¹) of one terahertz: 1e12 / (c in cm/s). */
export const WAVENUMBER_PER_THZ = 1e12 / (SPEED_OF_LIGHT_M_PER_S * 100);
/** Energy quantum of one terahertz in meV: h·1e12 / e · 1e3. */
export const MEV_PER_THZ = (PLANCK_J_S * 1e12) / ELEMENTARY_CHARGE_C * 1e3;
/** Kelvin equivalent of one terahertz: h·1e12 / k_B. */
export const KELVIN_PER_THZ = (PLANCK_J_S * 1e12) / BOLTZMANN_J_PER_K;
