import { describe, expect, it } from 'vitest';
import type { ReportSummary } from '../../../shared/report-summary';
import { headlineCards } from './headline-cards';

const D = (a2PerPs: number) => ({ a2PerPs, e9M2PerS: a2PerPs * 10, cm2PerS: a2PerPs * 1e-4 });

const liquid: ReportSummary = {
  msd: { dimensions: 3, groups: [{ label: 'all', atoms: 108, regime: 'diffusive', d: D(0.1595), dStdError: D(0.0075), uncertaintyMethod: 'atom-blocks', slopeExponent: 0.98, fitWindowPs: { start: 0.86, end: 1.73, source: 'auto' }, plateauA2: null }] },
  vacf: { velocitySource: 'stored-velocities', groups: [{ label: 'all', atoms: 108, dGreenKubo: D(0.154), spread: D(0.0125), converged: false, plateauWindowPs: { start: 0.86, end: 1.73, source: 'auto' } }] },
  thermo: { temperatureK: { mean: 86.47, stdError: 1.23 }, densityGPerCm3: { mean: 1.4123, stdError: 0.0004 }, degreesOfFreedom: 321, equilibrated: true },
  lindemann: { index: 0.21, threshold: 0.1, melted: true, displacementRatio: 0.4 },
};

describe('headline cards', () => {
  it('when D is switched between units, then the card shows the matching number and unit label', () => {
    const [a2] = headlineCards(liquid, 'a2PerPs');
    const [si] = headlineCards(liquid, 'e9M2PerS');
    const [cgs] = headlineCards(liquid, 'cm2PerS');
    expect([a2!.value, a2!.unit]).toEqual(['0.1595 ± 0.0075', 'Å²/ps']);
    expect([si!.value, si!.unit]).toEqual(['1.595 ± 0.075', '10⁻⁹ m²/s']);
    expect([cgs!.value, cgs!.unit]).toEqual(['(1.595 ± 0.075) × 10⁻⁵', 'cm²/s']);
  });

  it('when only some analyses ran, then only their cards appear, in reading order', () => {
    expect(headlineCards(liquid, 'a2PerPs').map((c) => c.id)).toEqual(['msd', 'vacf', 'thermo', 'lindemann']);
    expect(headlineCards({ thermo: liquid.thermo }, 'a2PerPs').map((c) => c.id)).toEqual(['thermo']);
    expect(headlineCards({}, 'a2PerPs')).toEqual([]);
  });

  it('when D has a block error, then the card says where it came from; an old Green–Kubo spread is not shown as ±', () => {
    const cards = headlineCards(liquid, 'a2PerPs');
    expect(cards.find((c) => c.id === 'msd')!.detail).toContain('± from independent groups of atoms');
    const oldGk = cards.find((c) => c.id === 'vacf')!;
    expect(oldGk.value).toBe('0.154');
    expect(oldGk.detail).toContain('its spread there is 0.013 (not an error bar)');
    const gk = headlineCards({ vacf: { ...liquid.vacf!, groups: [{ ...liquid.vacf!.groups[0]!, dStdError: D(0.004), uncertaintyMethod: 'atom-blocks', uncertaintyBlocks: 16 }] } }, 'a2PerPs')[0]!;
    expect(gk.value).toBe('0.1540 ± 0.0040');
    expect(gk.detail).toContain('± from 16 independent groups of atoms');
  });

  it('when the Green–Kubo integral has not converged or the run melted, then the card carries a warning', () => {
    const cards = headlineCards(liquid, 'a2PerPs');
    expect(cards.find((c) => c.id === 'vacf')!.warning).toMatch(/not settled/);
    expect(cards.find((c) => c.id === 'lindemann')!.warning).toMatch(/Melted/);
    expect(cards.find((c) => c.id === 'msd')!.warning).toBeNull();
  });

  it('when the MSD is bounded, then D is a dash and the detail names the plateau', () => {
    const bounded: ReportSummary = { msd: { dimensions: 3, groups: [{ ...liquid.msd!.groups[0]!, regime: 'bounded', d: null, dStdError: null, plateauA2: 0.412 }] } };
    const [card] = headlineCards(bounded, 'a2PerPs');
    expect(card!.value).toBe('—');
    expect(card!.detail).toContain('0.412 Å²');
  });

  it('when the temperature card is built, then it names the degrees of freedom and shows density with its error', () => {
    const card = headlineCards(liquid, 'a2PerPs').find((c) => c.id === 'thermo')!;
    expect(card.value).toBe('86.5 ± 1.2');
    expect(card.detail).toContain('321 degrees of freedom');
    expect(card.detail).toContain('1.41230 ± 0.00040 g/cm³');
  });

  it('when velocities came from positions, then the temperature card names the correction and carries the coarse-sampling warning', () => {
    const coarse: ReportSummary = { thermo: { ...liquid.thermo!, velocitySource: 'central-differences', differenceCorrection: 1.974, warnings: ['Frames are 5.00 fs apart and carry no velocities …'] } };
    const [card] = headlineCards(coarse, 'a2PerPs');
    expect(card!.detail).toContain('velocities from positions, finite-difference damping corrected (×1.97)');
    expect(card!.warning).toBe('Frames are 5.00 fs apart and carry no velocities …');
  });

  it('when the heat capacity card is built, then it names the temperature used, the stated one, and carries the 5 % warning', () => {
    const zero = { perAtomKB: 0, jPerMolK: 0, jPerGK: 0 };
    const vdos: NonNullable<ReportSummary['vdos']> = {
      temperatureK: 196.2, temperatureSource: 'kinetic', kineticTemperatureK: 196.2, statedTemperatureK: 300,
      temperatureWarning: 'The kinetic temperature 196.2 K is 35 % below the stated 300.0 K: check the constraints.',
      peaks: [], cv: { quantum: { perAtomKB: 1.1, jPerMolK: 9.1, jPerGK: 0.3 }, classical: zero }, entropy: { quantum: zero, classical: zero },
      zeroPoint: { evPerAtom: 0.06, kJPerMol: 6 }, modes: 381,
    };
    const cv = headlineCards({ vdos }, 'a2PerPs').find((c) => c.id === 'cv')!;
    expect(cv.title).toBe('Heat capacity Cv at 196.2 K');
    expect(cv.detail).toContain('at 196.2 K, the kinetic temperature; stated 300 K');
    expect(cv.warning).toMatch(/35 % below the stated 300\.0 K/);
    const chosen = headlineCards({ vdos: { ...vdos, temperatureSource: 'chosen', temperatureK: 250, temperatureWarning: null } }, 'a2PerPs').find((c) => c.id === 'cv')!;
    expect(chosen.detail).toContain('at 250 K, the temperature chosen for this analysis; kinetic 196.2 K; stated 300 K');
    expect(chosen.warning).toBeNull();
  });
});

describe('coordination card', () => {
  it('when g(r) has no shell, then the card gives no number and says there is no structure above counting noise', () => {
    const [card] = headlineCards({ rdf: { pairs: [{ label: 'all', firstPeak: null, firstMinimum: null }] } }, 'a2PerPs');
    expect(card!.value).toBe('—');
    expect(card!.detail).toMatch(/No shell: g\(r\) has no peak standing above its counting noise/);
  });
});
