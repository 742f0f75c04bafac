import { describe, expect, it } from 'vitest';
import { energy } from '../../../server/analysis/energy.ts';
import { thermo } from '../../../server/analysis/thermo.ts';
import { vdos } from '../../../server/analysis/vdos.ts';
import { centralDifferenceGain, CORRECTABLE_OMEGA_DT } from '../../../server/analysis/velocity-spectrum.ts';
import { diatomicBox } from './known-answer-systems.ts';
import { makeTrajectory } from './synthetic.ts';

// SCIENCE item 6: harmonic wavenumbers ω_e of H³⁵Cl 2990.946 cm⁻¹ and ¹²C¹⁶O 2169.81358 cm⁻¹ (Huber & Herzberg
// via the NIST WebBook; digits FROM MEMORY, within 0.06 cm⁻¹ of the CONFIRMED CCCBDB values); AME masses FROM MEMORY.
const HCL = { speciesA: 'H', speciesB: 'Cl', massA: 1.00782503223, massB: 34.968852682, wavenumberCm1: 2990.946, bondLengthA: 1.275 };
const CO = { speciesA: 'C', speciesB: 'O', massA: 12, massB: 15.99491461957, wavenumberCm1: 2169.81358, bondLengthA: 1.128 };
const masses = { H: HCL.massA, Cl: HCL.massB, C: CO.massA, O: CO.massB };
const CM1_PER_THZ = 33.35640952;

/** 32 HCl and 32 CO that neither move nor turn: one degree of freedom each, every stretch holding exactly k_BT. */
const molecules = (dtPs: number, velocities: boolean) => diatomicBox([{ ...HCL, molecules: 32 }, { ...CO, molecules: 32 }], {
  temperatureK: 300, timeStepPs: dtPs, frames: 4096, boxA: 30, seed: 5, translate: false, velocities, equipartitionEnergy: true,
});

// SCIENCE item 24 [DERIVED]: the central difference [x(t+Δt) − x(t−Δt)]/(2Δt) of x = A·cos ωt is exactly
// v(t)·sin(ωΔt)/(ωΔt), so its power — and the kinetic energy read from it — is low by [sin(ωΔt)/(ωΔt)]².
describe('Velocities from positions: the central difference transfer function (SCIENCE item 24)', () => {
  it('when x = A·cos ωt is differenced, then the result is v·sin(ωΔt)/(ωΔt) exactly', () => {
    const omega = 3.1, dt = 0.2, A = 1.7;
    for (let t = 1; t < 40; t++) {
      const fd = (A * Math.cos(omega * (t + 1) * dt) - A * Math.cos(omega * (t - 1) * dt)) / (2 * dt);
      const v = -A * omega * Math.sin(omega * t * dt);
      expect(fd).toBeCloseTo(v * centralDifferenceGain(omega / (2 * Math.PI), dt), 12);
    }
  });

  it('when HCl is sampled every 2.5 fs, then ωΔt = 1.41 and the uncorrected kinetic energy would read 0.49 of its value (the SCIENCE example)', () => {
    const nu = 2990.9 / CM1_PER_THZ;
    expect(2 * Math.PI * nu * 0.0025).toBeCloseTo(1.41, 2);
    expect(centralDifferenceGain(nu, 0.0025) ** 2).toBeCloseTo(0.49, 2);
  });

  it('when HCl and CO are stored as positions every 2.5 fs with one degree of freedom per molecule, then T is 300 K within 2 % from both the spectrum and the temperature series, and both lines sit within one bin of ω_e', () => {
    const traj = molecules(0.0025, false);
    const spectrum = vdos(traj, { masses, degreesOfFreedom: 64 });
    const series = thermo(traj, { masses, degreesOfFreedom: 64 });
    expect(spectrum.velocitySource).toBe('central-differences');
    expect(Math.abs(spectrum.groups[0].kineticTemperatureK / 300 - 1)).toBeLessThan(0.02);
    expect(Math.abs(series.temperature.mean / 300 - 1)).toBeLessThan(0.02);
    // Without the correction both would read about 178 K (HCl at 0.49, CO at 0.71 of 150 K each).
    expect(series.differenceCorrection).toBeGreaterThan(1.6);
    const bin = spectrum.binWidthThz * CM1_PER_THZ;
    const lines = spectrum.groups[0].peaks.map((p) => p.cm1);
    for (const target of [HCL.wavenumberCm1, CO.wavenumberCm1]) expect(Math.min(...lines.map((l) => Math.abs(l - target)))).toBeLessThan(bin);
    expect(spectrum.warnings).toEqual([]);
    expect(series.warnings).toEqual([]);
  });

  it('when the energy analysis has only those positions, then its kinetic energy follows the same correction: T is 300 K within 2 % (178 K uncorrected) and its source says so', () => {
    const traj = { ...molecules(0.0025, false), observables: { energy: new Float64Array(4096) } };
    const e = energy(traj, { masses, degreesOfFreedom: 64, removeComDrift: false, fileQuantities: { potentialEnergy: { key: 'energy', unit: 'eV' } } });
    expect(Math.abs(e.means.temperatureK.mean / 300 - 1)).toBeLessThan(0.02);
    expect(e.sources.kinetic).toMatch(/^differences of positions, scaled by 1\.\d{4} to undo their sin\(ωΔt\)\/\(ωΔt\) damping/);
  });

  it('when the same molecules carry stored velocities, then nothing is corrected and T is 300 K within 0.1 %', () => {
    const traj = molecules(0.0025, true);
    const spectrum = vdos(traj, { masses, degreesOfFreedom: 64 });
    expect(spectrum.differenceCorrection).toBeNull();
    expect(Math.abs(spectrum.groups[0].kineticTemperatureK / 300 - 1)).toBeLessThan(1e-3);
    expect(thermo(traj, { masses, degreesOfFreedom: 64 }).differenceCorrection).toBe(1);
  });

  it('when frames are 5 fs apart, then the CO line (ωΔt = 2.04) is restored within one bin, while HCl (ωΔt = 2.82 > 3π/4) cannot be and both analyses warn with the spacing that would do', () => {
    const traj = molecules(0.005, false);
    expect(2 * Math.PI * (HCL.wavenumberCm1 / CM1_PER_THZ) * 0.005).toBeGreaterThan(CORRECTABLE_OMEGA_DT);
    const spectrum = vdos(traj, { masses, degreesOfFreedom: 64 });
    const bin = spectrum.binWidthThz * CM1_PER_THZ;
    expect(Math.abs(spectrum.groups[0].peaks[0].cm1 - CO.wavenumberCm1)).toBeLessThan(bin);
    // CO's 32 modes are restored (150 K of the 300 K); HCl's stay damped by sinc² = 0.013.
    expect(Math.abs(spectrum.groups[0].kineticTemperatureK / 150 - 1)).toBeLessThan(0.03);
    expect(spectrum.warnings).toHaveLength(1);
    expect(spectrum.warnings[0]).toMatch(/cannot be corrected.*at most 2\.8 fs apart/);
    expect(thermo(traj, { masses, degreesOfFreedom: 64 }).warnings).toEqual(spectrum.warnings);
  });

  it('when a slowly moving system is differenced, then the correction is negligible (gain → 1 as ωΔt → 0)', () => {
    const omega = 0.2, dt = 0.01;
    const traj = makeTrajectory(20, 2000, dt, (f, i, out) => {
      for (let c = 0; c < 3; c++) out[c] = 5 * i + Math.cos(omega * f * dt + i + c);
    });
    const r = vdos(traj, { removeComDrift: false });
    expect(r.differenceCorrection?.correctedOverRaw).toBeCloseTo(1, 4);
    expect(r.warnings).toEqual([]);
  });
});
