import { describe, expect, it } from 'vitest';
import { degreesOfFreedom, groupShare } from '../../../server/analysis/degrees-of-freedom.ts';
import { runAnalyses } from '../../../server/analysis/index.ts';
import { chooseTemperature } from '../../../server/analysis/temperature-choice.ts';
import { DEMO_TRAJECTORIES } from '../../../server/demo/demo-trajectories.ts';
import { diatomicBox } from './known-answer-systems.ts';

// SCIENCE item 8 [COMMON PRACTICE; Allen & Tildesley 2017, FROM MEMORY for the section]:
// N_dof = 3N − N_c − N_COM; rigid 3-site water has 6·N_mol − 3.
describe('One rule for degrees of freedom (SCIENCE item 8)', () => {
  it('when the centre of mass is removed, then f = 3N − 3; without removal f = 3N', () => {
    expect(degreesOfFreedom({ nAtoms: 300, removeComDrift: true }).total).toBe(897);
    expect(degreesOfFreedom({ nAtoms: 300, removeComDrift: false }).total).toBe(900);
  });

  it('when 100 rigid 3-site waters are stated with 3 constraints each, then f = 6·N_mol − 3 and the rule says how', () => {
    const f = degreesOfFreedom({ nAtoms: 300, removeComDrift: true, constraints: 300 });
    expect(f.total).toBe(6 * 100 - 3);
    expect(f.rule).toBe('3·300 − 300 constraints − 3 (centre of mass) = 597');
  });

  it('when a count is given, then it replaces the rule; a group gets its share by atoms and components', () => {
    const f = degreesOfFreedom({ nAtoms: 128, removeComDrift: true, constraints: 10, degreesOfFreedom: 64 });
    expect(f).toEqual({ total: 64, rule: 'given: 64' });
    expect(groupShare(f, 64, 128)).toBe(32);
    expect(groupShare(f, 128, 128, 2)).toBeCloseTo(64 * 2 / 3, 12);
  });

  it('when constraints leave nothing, then the error says to check them', () => {
    expect(() => degreesOfFreedom({ nAtoms: 2, removeComDrift: true, constraints: 3 })).toThrow(/check the constraints/);
  });
});

describe('One rule for the temperature behind heat capacity and entropy', () => {
  it('when nothing is chosen, then the kinetic temperature is used and the stated one stands beside it', () => {
    expect(chooseTemperature(297, null, 300)).toEqual({ usedK: 297, source: 'kinetic', kineticK: 297, statedK: 300, warning: null });
  });

  it('when a temperature is chosen, then it is used and the kinetic one is still reported', () => {
    expect(chooseTemperature(297, 250, 300)).toMatchObject({ usedK: 250, source: 'chosen', kineticK: 297 });
  });

  it('when kinetic and stated differ by more than 5 %, then a warning names both and what to check; at 4 % there is none', () => {
    expect(chooseTemperature(196, null, 300).warning).toBe('The kinetic temperature 196.0 K is 35 % below the stated 300.0 K: check the constraints (degrees of freedom), the masses and the velocity unit.');
    expect(chooseTemperature(312, null, 300).warning).toBeNull();
    expect(chooseTemperature(312, null, null).warning).toBeNull();
  });
});

describe('The demo diatomics read their true temperature', () => {
  const demo = DEMO_TRAJECTORIES.find((d) => d.fileName.startsWith('model-diatomics'))!;
  const traj = demo.simulate();

  it('when the demo states its frozen rotations (2 per molecule), then temperature series and VDOS agree near 300 K without a warning', () => {
    expect(demo.metadata.constraints).toBe(128);
    const run = runAnalyses(traj, ['thermo', 'vdos'], {}, undefined, { statedTemperatureK: 300, constraints: demo.metadata.constraints });
    const thermo = run.summary.thermo!, vdos = run.summary.vdos!;
    expect(thermo.degreesOfFreedom).toBe(3 * 128 - 128 - 3);
    // 64 molecules of 4 degrees of freedom each: a canonical sample spreads by √(2/253) ≈ 9 %, so 5 % is a fair check here.
    expect(Math.abs(thermo.temperatureK.mean / 300 - 1)).toBeLessThan(0.05);
    expect(thermo.warnings).toEqual([]);
    expect(vdos.kineticTemperatureK).toBeCloseTo(thermo.temperatureK.mean, 6);
    expect(vdos.temperatureSource).toBe('kinetic');
    expect(vdos.temperatureK).toBe(vdos.kineticTemperatureK);
    expect(vdos.statedTemperatureK).toBe(300);
    expect(run.methods.params.constraints).toBe(128);
  });

  it('when the constraints are left out, then 3N − 3 reads about 196 K and both analyses warn', () => {
    const run = runAnalyses(traj, ['thermo', 'vdos'], {}, undefined, { statedTemperatureK: 300 });
    const right = runAnalyses(traj, ['thermo'], {}, undefined, { constraints: 128 });
    // The same kinetic energy shared over 381 instead of 253 degrees of freedom.
    expect(run.summary.thermo!.temperatureK.mean / right.summary.thermo!.temperatureK.mean).toBeCloseTo(253 / 381, 10);
    expect(run.summary.thermo!.temperatureK.mean).toBeLessThan(210);
    expect(run.summary.thermo!.warnings?.[0]).toMatch(/below the stated 300\.0 K/);
    expect(run.summary.vdos!.temperatureWarning).toMatch(/below the stated 300\.0 K/);
  });

  it('when constraints are given with the run, then they win over those stated with the trajectory', () => {
    const run = runAnalyses(traj, ['thermo'], { constraints: 0 }, undefined, { constraints: 128 });
    expect(run.summary.thermo!.degreesOfFreedom).toBe(381);
  });
});

describe('Temperature chosen for the harmonic quantities', () => {
  const box = diatomicBox([{ speciesA: 'C', speciesB: 'O', wavenumberCm1: 2143, bondLengthA: 1.128, molecules: 16 }], { temperatureK: 300, timeStepPs: 0.001, frames: 1024, boxA: 20, seed: 3 });

  it('when a temperature is chosen, then Cv is evaluated there and the summary says so beside the kinetic one', () => {
    const run = runAnalyses(box, ['vdos'], { temperatureK: 1000 }, undefined, { statedTemperatureK: 300, constraints: 32 });
    const v = run.summary.vdos!;
    expect(v.temperatureSource).toBe('chosen');
    expect(v.temperatureK).toBe(1000);
    expect(v.kineticTemperatureK).toBeLessThan(500);
    expect(v.degreesOfFreedomRule).toBe('3·32 − 32 constraints − 3 (centre of mass) = 61');
  });
});
