import { describe, expect, it } from 'vitest';
import { KELVIN_PER_THZ } from '../../../server/analysis/constants.ts';
import { cvWeight } from '../../../server/analysis/harmonic-thermo.ts';
import { runAnalyses } from '../../../server/analysis/index.ts';
import { diatomicBox, randomWalkMixture } from './known-answer-systems.ts';
import { ornsteinUhlenbeck, randomWalk } from './synthetic.ts';

// SCIENCE item 30 [COMMON PRACTICE]: a correct standard error puts the truth within ±2σ in about 95 % of
// independent runs. Over 20 seeds we ask for at least 85 % (17 of 20), as issue 9 does; the errors come
// from 16 independent atom blocks, t-distributed with 15 degrees of freedom (≈ 94 % expected at ±2σ).
const SEEDS = Array.from({ length: 20 }, (_, i) => i + 1);
const covered = (runs: { value: number; error: number | null | undefined }[], truth: number) =>
  runs.filter((r) => r.error !== null && r.error !== undefined && Math.abs(r.value - truth) <= 2 * r.error).length;

describe('Error bars that cover the truth (SCIENCE item 30)', () => {
  it('when 20 Gaussian random walks of D = 0.5 Å²/ps are fitted (SCIENCE item 1), then the MSD error covers the true D within ±2σ in ≥ 85 % of them', () => {
    const runs = SEEDS.map((seed) => {
      const g = runAnalyses(randomWalk(100, 500, 0.1, 0.5, 1000 + seed), ['msd'], { removeComDrift: false }).summary.msd!.groups[0];
      expect(g.uncertaintyMethod).toBe('atom-blocks');
      return { value: g.d!.a2PerPs, error: g.dStdError?.a2PerPs };
    });
    expect(covered(runs, 0.5)).toBeGreaterThanOrEqual(17);
  });

  it('when the same walks are stored as positions only, then the Green–Kubo error from central-difference velocities covers D in ≥ 85 %', () => {
    const runs = SEEDS.map((seed) => {
      const g = runAnalyses(randomWalk(100, 500, 0.1, 0.5, 1000 + seed), ['vacf'], { removeComDrift: false }).summary.vacf!.groups[0];
      return { value: g.dGreenKubo.a2PerPs, error: g.dStdError?.a2PerPs };
    });
    expect(covered(runs, 0.5)).toBeGreaterThanOrEqual(17);
  });

  it('when 20 Ornstein–Uhlenbeck runs with D = k_BT/(mγ) = 1 carry velocities (SCIENCE item 3), then the Green–Kubo error covers D in ≥ 85 %', () => {
    const runs = SEEDS.map((seed) => {
      const g = runAnalyses(ornsteinUhlenbeck(100, 2000, 0.05, 1, 1, 2000 + seed), ['vacf'], { removeComDrift: false }).summary.vacf!.groups[0];
      expect(g.uncertaintyMethod).toBe('atom-blocks');
      return { value: g.dGreenKubo.a2PerPs, error: g.dStdError?.a2PerPs };
    });
    expect(covered(runs, 1)).toBeGreaterThanOrEqual(17);
  });

  it('when a species has only 3 atoms, then its D gets an error from consecutive stretches of the run that still covers the truth in ≥ 85 %', () => {
    const runs = SEEDS.map((seed) => {
      const mix = randomWalkMixture([{ species: 'Ar', atoms: 40, d: 0.2 }, { species: 'Xe', atoms: 3, d: 0.05 }], { frames: 4000, timeStepPs: 0.1, boxA: 40, seed });
      const groups = runAnalyses(mix, ['msd', 'vacf'], { removeComDrift: false }).summary;
      const msd = groups.msd!.groups.find((g) => g.label === 'Xe')!;
      const gk = groups.vacf!.groups.find((g) => g.label === 'Xe')!;
      expect(msd.uncertaintyMethod).toBe('time-blocks');
      expect(gk.uncertaintyMethod).toBe('time-blocks');
      return { msd: { value: msd.d!.a2PerPs, error: msd.dStdError?.a2PerPs }, gk: { value: gk.dGreenKubo.a2PerPs, error: gk.dStdError?.a2PerPs } };
    });
    expect(covered(runs.map((r) => r.msd), 0.05)).toBeGreaterThanOrEqual(17);
    expect(covered(runs.map((r) => r.gk), 0.05)).toBeGreaterThanOrEqual(17);
  });

  // SCIENCE items 6, 8, 16: a harmonic CO line at ω_e = 2169.81 cm⁻¹ (Huber & Herzberg, FROM MEMORY digits); each
  // non-translating, non-rotating molecule has one degree of freedom; canonical amplitudes make every box a fresh
  // sample of the 300 K ensemble, whose Cv per molecule is the Einstein value x²eˣ/(eˣ−1)² at x = hν/k_BT.
  it('when 20 boxes of canonical CO stretches at 300 K are analysed, then the kinetic temperature, Cv and the line position errors cover the truth in ≥ 85 %', () => {
    const co = { speciesA: 'C', speciesB: 'O', massA: 12, massB: 15.99491461957, wavenumberCm1: 2169.81358, bondLengthA: 1.128, molecules: 64 };
    const thz = co.wavenumberCm1 / 33.35640952;
    const cvTrue = cvWeight((thz * KELVIN_PER_THZ) / 300) / 2;
    const runs = SEEDS.map((seed) => {
      const box = diatomicBox([co], { temperatureK: 300, timeStepPs: 0.0005, frames: 2048, boxA: 20, seed, translate: false });
      const v = runAnalyses(box, ['vdos'], { masses: { C: co.massA, O: co.massB }, degreesOfFreedom: 64, removeComDrift: false }).summary.vdos!;
      return {
        t: { value: v.kineticTemperatureK!, error: v.stdErrors?.kineticTemperatureK },
        cv: { value: v.cv.quantum.perAtomKB, error: v.stdErrors?.cvPerAtomKB },
        line: { value: v.peaks[0].cm1, error: v.peaks[0].cm1StdError },
      };
    });
    expect(covered(runs.map((r) => r.t), 300)).toBeGreaterThanOrEqual(17);
    expect(covered(runs.map((r) => r.cv), cvTrue)).toBeGreaterThanOrEqual(17);
    expect(covered(runs.map((r) => r.line), co.wavenumberCm1)).toBeGreaterThanOrEqual(17);
  });

  it('when a group has too few atoms and too short a run for independent blocks, then no error is given rather than a false one', () => {
    const g = runAnalyses(randomWalk(3, 30, 0.1, 0.5, 4), ['msd'], { removeComDrift: false, fitWindow: { mode: 'manual', startPs: 0.5, endPs: 1.4 } }).summary.msd!.groups[0];
    expect(g.d).not.toBeNull();
    expect(g.dStdError).toBeNull();
    expect(g.uncertaintyMethod).toBe('none');
  });
});
