import { describe, expect, it } from 'vitest';
import { fitArrhenius, type ArrheniusMember } from '../../../server/analysis/series/arrhenius-fit.ts';
import { SeededRandom } from '../../../server/simulate/random.ts';

const R = 8.314462618; // J/(mol·K), CODATA 2018 (SCIENCE item 7)

function members(temperatures: number[], d: number[], dStdError?: number[]): ArrheniusMember[] {
  return temperatures.map((t, i) => ({ trajectoryId: i + 1, label: `${t} K`, temperatureK: t, d: d[i], dStdError: dStdError?.[i] ?? null, phase: 'liquid', excluded: false }));
}

describe('Arrhenius fit across a series (SCIENCE item 13)', () => {
  it('when D(T) is exactly Arrhenius with E_a = 18 000 J/mol and D0 = 1e-6, then both are recovered to 1e-9 relative', () => {
    const T = [250, 275, 300, 325, 350, 375, 400];
    const D = T.map((t) => 1e-6 * Math.exp(-18_000 / (R * t)));
    const fit = fitArrhenius(members(T, D));
    expect(fit.status).toBe('fitted');
    expect(Math.abs(fit.activationEnergy!.kJPerMol / 18 - 1)).toBeLessThan(1e-9);
    expect(Math.abs(fit.d0!.a2PerPs / 1e-6 - 1)).toBeLessThan(1e-9);
    expect(fit.rangeK).toEqual({ min: 250, max: 400 });
    for (const p of fit.points) expect(Math.abs(p.lnResidual)).toBeLessThan(1e-9);
  });

  it('when the activation energy is read in eV, then 18.35 kJ/mol is 0.1902 eV (SCIENCE item 13, exact constants)', () => {
    const T = [280, 320];
    const fit = fitArrhenius(members(T, T.map((t) => Math.exp(-18_350 / (R * t)))));
    expect(fit.activationEnergy!.eV).toBeCloseTo(0.1902, 4);
  });

  // Holz, Heil & Sacco, PCCP 2, 4740 (2000): Speedy–Angell fit D = D0·(T/Ts − 1)^γ with D0 = 1.635e-8 m²/s,
  // Ts = 215.05 K, γ = 2.063, stated error < 1 % (SCIENCE item 12). A straight Arrhenius fit over 15–35 °C gives
  // E_a = 18.4 ± 0.3 kJ/mol (SCIENCE item 13 [DERIVED]); Gillen et al. quote 4.5 kcal/mol = 18.8 kJ/mol at 25 °C.
  it('when the Holz water D(T) table at 15–35 °C is fitted with its 1 % errors, then E_a = 18.4 ± 0.3 kJ/mol', () => {
    const holz = (t: number) => 1.635e-8 * (t / 215.05 - 1) ** 2.063;
    expect(holz(298.15) * 1e9).toBeCloseTo(2.299, 3); // the table's 25 °C entry, 2.299e-9 m²/s
    const T = [15, 20, 25, 30, 35].map((c) => c + 273.15);
    const D = T.map((t) => holz(t) * 1e8); // m²/s → Å²/ps
    const fit = fitArrhenius(members(T, D, D.map((d) => 0.01 * d)));
    expect(fit.errorMethod).toBe('d-errors');
    expect(Math.abs(fit.activationEnergy!.kJPerMol - 18.4)).toBeLessThan(0.3);
    // The stated uncertainty covers the gap between this fit and the 18.41 of the derived straight fit.
    expect(Math.abs(fit.activationEnergy!.kJPerMol - 18.41)).toBeLessThan(2 * fit.activationEnergyStdError!.kJPerMol);
    expect(fit.d0!.e9M2PerS * 1e-9).toBeCloseTo(3.85e-6, 7);
  });

  it('when members carry no D error, then the error comes from the scatter, and two such points give none', () => {
    const fit = fitArrhenius(members([300, 350, 400], [1, 2.1, 3.9]));
    expect(fit.errorMethod).toBe('scatter');
    expect(fit.activationEnergyStdError!.kJPerMol).toBeGreaterThan(0);
    const two = fitArrhenius(members([300, 400], [1, 4]));
    expect(two.errorMethod).toBe('none');
    expect(two.activationEnergyStdError).toBeNull();
    expect(two.warnings.join(' ')).toMatch(/Two points/);
  });
});

/**
 * Coverage (SCIENCE item 30): over many synthetic series with a known E_a and Gaussian D noise
 * of a known size, |E_a − truth| ≤ 1σ in about 68 % of them and ≤ 2σ in about 95 %.
 */
describe('the E_a error bar means what it says (SCIENCE item 30)', () => {
  const truth = 12_000; // J/mol
  const T = [250, 280, 310, 340, 370, 400];
  const trials = 600;

  function coverage(noise: number, statedFactor: number | null, seed: number) {
    const rng = new SeededRandom(seed);
    let within1 = 0, within2 = 0;
    for (let k = 0; k < trials; k++) {
      const D = T.map((t) => 5e-3 * Math.exp(-truth / (R * t)) * (1 + noise * rng.normal()));
      const errors = statedFactor === null ? undefined : D.map((d) => statedFactor * noise * d);
      const fit = fitArrhenius(members(T, D, errors));
      const miss = Math.abs(fit.activationEnergy!.kJPerMol * 1e3 - truth);
      const sigma = fit.activationEnergyStdError!.kJPerMol * 1e3;
      if (miss <= sigma) within1++;
      if (miss <= 2 * sigma) within2++;
    }
    return { one: within1 / trials, two: within2 / trials };
  }

  it('when the members\' D errors are right, then E_a is within 1σ in about 68 % of series and within 2σ in about 95 %', () => {
    const c = coverage(0.05, 1, 101);
    expect(c.one).toBeGreaterThan(0.64);
    expect(c.one).toBeLessThan(0.82); // scaling by √(χ²/ν) only ever widens: a little over 68 %
    expect(c.two).toBeGreaterThan(0.93);
  });

  it('when the members understate their D errors fourfold, then scaling by the scatter still covers the truth near the nominal rate', () => {
    const c = coverage(0.05, 0.25, 202);
    // With ν = 4 the scaled error follows Student's t: P(|t| ≤ 1) = 0.63, P(|t| ≤ 2) = 0.88 [COMMON PRACTICE].
    expect(c.one).toBeGreaterThan(0.56);
    expect(c.two).toBeGreaterThan(0.83);
  });

  it('when the members state no errors, then the scatter-based error covers the truth as Student\'s t with 4 degrees of freedom says', () => {
    const c = coverage(0.05, null, 303);
    expect(c.one).toBeGreaterThan(0.56);
    expect(c.one).toBeLessThan(0.72);
    expect(c.two).toBeGreaterThan(0.83);
  });
});

describe('which members the fit uses', () => {
  it('when a member is excluded, has no D, or D is zero within error, then it is left out with its reason', () => {
    const fit = fitArrhenius([
      { trajectoryId: 1, label: '40 K', temperatureK: 40, d: null, dStdError: null, phase: 'solid', excluded: false },
      { trajectoryId: 2, label: '60 K', temperatureK: 60, d: 0.001, dStdError: 0.002, phase: 'solid', excluded: false },
      { trajectoryId: 3, label: '90 K', temperatureK: 90, d: 0.17, dStdError: 0.01, phase: 'liquid', excluded: false },
      { trajectoryId: 4, label: '110 K', temperatureK: 110, d: 0.3, dStdError: 0.02, phase: 'liquid', excluded: true },
      { trajectoryId: 5, label: '130 K', temperatureK: 130, d: 0.5, dStdError: 0.02, phase: 'liquid', excluded: false },
    ]);
    expect(fit.points.map((p) => p.trajectoryId)).toEqual([3, 5]);
    expect(Object.fromEntries(fit.leftOut.map((l) => [l.trajectoryId, l.reason]))).toEqual({
      1: 'no diffusion coefficient (bounded or too short MSD)', 2: 'D is zero within 2 standard errors', 4: 'excluded from fits',
    });
    expect(fit.warnings.join(' ')).not.toMatch(/phase change/);
  });

  it('when the fitted points are a solid and liquids, then the fit warns that they span a phase change', () => {
    const fit = fitArrhenius([
      { trajectoryId: 1, label: '60 K', temperatureK: 60, d: 0.02, dStdError: 0.001, phase: 'solid', excluded: false },
      { trajectoryId: 2, label: '90 K', temperatureK: 90, d: 0.17, dStdError: 0.01, phase: 'liquid', excluded: false },
      { trajectoryId: 3, label: '130 K', temperatureK: 130, d: 0.5, dStdError: 0.02, phase: 'liquid', excluded: false },
    ]);
    expect(fit.warnings[0]).toMatch(/span a phase change \(solid: 60 K; liquid: 90 K, 130 K\)/);
  });

  it('when fewer than two members have a usable D, then no fit is made and the message says why', () => {
    const fit = fitArrhenius(members([300], [1]));
    expect(fit.status).toBe('not-enough-points');
    expect(fit.message).toMatch(/only one member has a usable D/);
  });
});
