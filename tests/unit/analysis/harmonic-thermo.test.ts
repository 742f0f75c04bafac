import { describe, expect, it } from 'vitest';
import { GAS_CONSTANT_J_PER_MOL_K, KELVIN_PER_THZ, MEV_PER_THZ, WAVENUMBER_PER_THZ } from '../../../server/analysis/constants.ts';
import { yehHummerCorrectionM2PerS } from '../../../server/analysis/finite-size.ts';
import { harmonicThermo } from '../../../server/analysis/harmonic-thermo.ts';
import { lennardJonesReducedUnits, meVToThz, thzToMeV, thzToWavenumber, wavenumberToThz } from '../../../server/analysis/units.ts';

// SCIENCE item 16 [DERIVED, scipy quadrature]: C_V/3R for Einstein and Debye solids.
const TABLE: [number, number, number][] = [
  [0.1, 0.00454, 0.07582],
  [0.2, 0.17074, 0.36863],
  [0.25, 0.30409, 0.50306],
  [0.5, 0.72406, 0.82541],
  [1.0, 0.92067, 0.95173],
  [2.0, 0.97942, 0.98761],
];

describe('Harmonic heat capacity from a density of states (SCIENCE item 16)', () => {
  const theta = 343; // Cu Debye temperature [CONFIRMED via Kittel table]
  const nuMax = theta / KELVIN_PER_THZ;

  it.each(TABLE)('when a δ-DOS at ν_E sits at T/θ = %f, then C_V/3R matches the Einstein column (table rounding 5e-6)', (ratio, einstein) => {
    const dnu = nuMax / 1000;
    const freq = Float64Array.from({ length: 2001 }, (_, k) => k * dnu);
    const dos = new Float64Array(2001);
    dos[1000] = 3 / dnu;
    const r = harmonicThermo(freq, dos, ratio * theta, 1, 63.546);
    expect(r.modes).toBeCloseTo(3, 12);
    expect(Math.abs(r.quantum.cvPerAtomKB / 3 - einstein)).toBeLessThan(1e-5);
  });

  it.each(TABLE)('when g(ν) = 9ν²/ν_D³ on 20 001 points at T/θ = %f, then C_V/3R matches the Debye column to 1e-4', (ratio, _e, debye) => {
    const n = 20001;
    const freq = Float64Array.from({ length: n }, (_, k) => (k * nuMax) / (n - 1));
    const dos = freq.map((v) => (9 * v * v) / nuMax ** 3);
    const r = harmonicThermo(freq, dos, ratio * theta, 1, 63.546);
    expect(Math.abs(r.quantum.cvPerAtomKB / 3 - debye)).toBeLessThan(1e-4);
  });

  it('when T ≫ θ, then C_V → 3R = 24.943388 J/(mol·K) within 0.1 %, equal to the classical value', () => {
    const freq = Float64Array.from({ length: 2001 }, (_, k) => (k * nuMax) / 2000);
    const dos = freq.map((v) => (9 * v * v) / nuMax ** 3);
    const r = harmonicThermo(freq, dos, 100 * theta, 1, 63.546);
    expect(3 * GAS_CONSTANT_J_PER_MOL_K).toBeCloseTo(24.943388, 5);
    expect(Math.abs(r.quantum.cvJPerMolK / 24.943388 - 1)).toBeLessThan(1e-3);
    expect(r.classical.cvJPerMolK).toBeCloseTo(24.943388, 5);
    // Per gram: 3R / M(Cu) in J/(g·K).
    expect(r.classical.cvJPerGK).toBeCloseTo(24.943388 / 63.546, 4);
  });

  it('when the DOS has weight at ν = 0 (a liquid), then every quantity stays finite', () => {
    const freq = Float64Array.from({ length: 100 }, (_, k) => k * 0.1);
    const dos = freq.map((v) => 3 / (1 + v * v) / 1.47);
    const r = harmonicThermo(freq, dos, 300, 1, 40);
    for (const v of Object.values(r.quantum)) expect(Number.isFinite(v)).toBe(true);
    for (const v of Object.values(r.classical)) expect(Number.isFinite(v)).toBe(true);
  });

  it('when a mode of 10 THz is quantised, then its zero-point energy is hν/2 = 20.678 meV', () => {
    const freq = Float64Array.from([9.9, 10, 10.1]);
    const r = harmonicThermo(freq, Float64Array.from([0, 1 / 0.1, 0]), 300, 1, 1);
    expect(r.quantum.zeroPointPerAtomEV * 1e3).toBeCloseTo(thzToMeV(10) / 2, 9);
    expect(thzToMeV(10) / 2).toBeCloseTo(20.678, 3);
  });
});

// SCIENCE item 7: exact SI 2019 / CODATA 2018 conversions [CONFIRMED; DERIVED].
describe('Unit conversions (SCIENCE item 7)', () => {
  it('when 1 THz is converted, then it is 33.35640952 cm⁻¹, 4.135667697 meV and 47.99243 K', () => {
    expect(Math.abs(thzToWavenumber(1) / 33.35640952 - 1)).toBeLessThan(1e-9);
    expect(Math.abs(thzToMeV(1) / 4.135667697 - 1)).toBeLessThan(1e-9);
    expect(Math.abs(KELVIN_PER_THZ / 47.99243 - 1)).toBeLessThan(1e-6);
    expect(Math.abs(wavenumberToThz(1) / 0.0299792458 - 1)).toBeLessThan(1e-9);
    expect(Math.abs((MEV_PER_THZ / WAVENUMBER_PER_THZ) / 0.1239841984 - 1)).toBeLessThan(1e-9);
  });

  it('when ν goes to cm⁻¹, to meV and back, then it returns unchanged', () => {
    const nu = 12.3456;
    expect(meVToThz(thzToMeV(wavenumberToThz(thzToWavenumber(nu))))).toBeCloseTo(nu, 12);
  });

  it('when k_B·300 K is expressed, then it is 208.5104 cm⁻¹ and 25.852 meV', () => {
    expect(thzToWavenumber(300 / KELVIN_PER_THZ)).toBeCloseTo(208.5104, 3);
    expect(thzToMeV(300 / KELVIN_PER_THZ)).toBeCloseTo(25.852, 3);
  });
});

// SCIENCE item 9: σ = 3.4 Å, ε/k_B = 120 K, m = 39.948 u give τ = 2.1514 ps and σ²/τ = 5.373e-4 cm²/s [DERIVED].
describe('Lennard-Jones reduced units (SCIENCE item 9)', () => {
  it("when Rahman's argon parameters are used, then τ and the D unit match to 1e-4 (table rounding)", () => {
    const u = lennardJonesReducedUnits(3.4, 120, 39.948);
    expect(Math.abs(u.tauPs / 2.1514 - 1)).toBeLessThan(5e-5);
    expect(Math.abs(u.diffusionCm2PerS / 5.373e-4 - 1)).toBeLessThan(1e-4);
    expect(u.diffusionA2PerPs * 1e-16 / 1e-12).toBeCloseTo(u.diffusionCm2PerS, 12);
  });
});

// SCIENCE item 21: Yeh & Hummer, J. Phys. Chem. B 108, 15873 (2004) [CONFIRMED]; η(water, 25 °C) = 0.8903 mPa·s [FROM MEMORY].
describe('Finite-size correction (SCIENCE item 21)', () => {
  it('when water at 298.15 K in a 3 nm box is corrected, then ΔD = 2.32e-10 m²/s', () => {
    expect(yehHummerCorrectionM2PerS(298.15, 0.8903e-3, 3e-9)).toBeCloseTo(2.32e-10, 12);
  });
});
