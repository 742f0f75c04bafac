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

  it('when the run drifts and the thermo check found where it settles, then the card suggests that discard for the next run', () => {
    const drifting: ReportSummary = { thermo: { ...liquid.thermo!, equilibrated: false, suggestedDiscardPs: 2.346 } };
    expect(headlineCards(drifting, 'a2PerPs')[0]!.warning).toBe('Temperature or density drifts between the first and last third of the run. '
      + 'The temperature settles after about 2.35 ps from the start of the range: analyse again with “Discard for equilibration” set to 2.35 ps.');
    const noStart: ReportSummary = { thermo: { ...liquid.thermo!, equilibrated: false, suggestedDiscardPs: null } };
    expect(headlineCards(noStart, 'a2PerPs')[0]!.warning).toBe('Temperature or density drifts between the first and last third of the run.');
    expect(headlineCards(liquid, 'a2PerPs').find((c) => c.id === 'thermo')!.warning).toBeNull();
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

describe('cards for what the report already holds', () => {
  const zero = { perAtomKB: 0, jPerMolK: 0, jPerGK: 0 };
  const vdos: NonNullable<ReportSummary['vdos']> = {
    temperatureK: 86.5, temperatureSource: 'kinetic', kineticTemperatureK: 86.5, statedTemperatureK: 87,
    peaks: [], modes: 321,
    stdErrors: { blocks: 8, kineticTemperatureK: 1, cvPerAtomKB: 0.01, entropyPerAtomKB: 0.031, zeroPointEvPerAtom: 0.00021 },
    cv: { quantum: { perAtomKB: 2.98, jPerMolK: 24.8, jPerGK: 0.62 }, classical: zero },
    entropy: { quantum: { perAtomKB: 5.432, jPerMolK: 45.16 }, classical: { perAtomKB: 5.44, jPerMolK: 45.2 } },
    zeroPoint: { evPerAtom: 0.00712, kJPerMol: 0.687 },
  };

  it('when the spectrum ran, then entropy and zero-point energy have cards with their errors, units and the temperature used', () => {
    const cards = headlineCards({ vdos }, 'a2PerPs');
    const entropy = cards.find((c) => c.id === 'entropy')!;
    expect([entropy.title, entropy.value, entropy.unit]).toEqual(['Vibrational entropy at 86.5 K', '5.432 ± 0.031', 'k_B per atom']);
    expect(entropy.detail).toContain('at 86.5 K, the kinetic temperature; stated 87 K');
    expect(entropy.detail).toContain('45.16 J/(mol·K)');
    const zp = cards.find((c) => c.id === 'zero-point')!;
    expect([zp.value, zp.unit]).toEqual(['7.12 ± 0.21', 'meV per atom']);
    expect(zp.detail).toContain('0.687 kJ/mol');
    expect(zp.detail).toContain('321 modes');
  });

  it('when S(q) ran, then its first peak is a card with the spacing it implies, or a dash when there is none', () => {
    const [card] = headlineCards({ sq: { firstPeak: { qInvA: 1.9634, s: 2.71 } } }, 'a2PerPs');
    expect([card!.id, card!.value, card!.unit]).toEqual(['sq-peak', '1.963', 'Å⁻¹']);
    expect(card!.detail).toContain('2π/q = 3.2 Å');
    expect(headlineCards({ sq: { firstPeak: null } }, 'a2PerPs')[0]!.value).toBe('—');
    const refused = headlineCards({ sq: { firstPeak: null, refused: 'The cell is not periodic in all three directions.' } }, 'a2PerPs')[0]!;
    expect([refused.value, refused.warning]).toEqual(['—', 'The cell is not periodic in all three directions.']);
  });

  it('when α₂ ran on one species, then its peak and lag are shown; on a mixture, one row per species', () => {
    const [one] = headlineCards({ ngp: { peakLagPs: 1.25, peakAlpha2: 0.183, groups: [{ label: 'Ar', atoms: 108, peakLagPs: 1.25, peakAlpha2: 0.183 }] } }, 'a2PerPs');
    expect([one!.value, one!.rows]).toEqual(['0.183', undefined]);
    expect(one!.detail).toContain('at 1.25 ps');
    const [mix] = headlineCards({ ngp: { peakLagPs: null, peakAlpha2: null, groups: [
      { label: 'Na', atoms: 20, peakLagPs: 0.8, peakAlpha2: 0.42 }, { label: 'Cl', atoms: 20, peakLagPs: null, peakAlpha2: null },
    ] } }, 'a2PerPs');
    expect(mix!.rows).toEqual([
      { label: 'Na', value: '0.42', note: '20 atoms, at 0.8 ps' },
      { label: 'Cl', value: '—', note: '20 atoms, no peak inside the lags' },
    ]);
  });

  it('when a run holds several species, then D from MSD and VACF and the coordination are given per species or pair', () => {
    const all = liquid.msd!.groups[0]!;
    const msd: ReportSummary['msd'] = { dimensions: 3, groups: [all, { ...all, label: 'Na', atoms: 54, d: D(0.21), dStdError: D(0.012) }, { ...all, label: 'Cl', atoms: 54, d: D(0.11), dStdError: D(0.009), regime: 'subdiffusive' }] };
    const gk = liquid.vacf!.groups[0]!;
    const vacf: ReportSummary['vacf'] = { velocitySource: 'stored-velocities', groups: [gk, { ...gk, label: 'Na', converged: true, dStdError: D(0.01) }, { ...gk, label: 'Cl', converged: true, dStdError: D(0.01) }] };
    const rdf: ReportSummary['rdf'] = { pairs: [
      { label: 'all', firstPeak: { rA: 2.9, g: 2.4 }, firstMinimum: { rA: 3.8, coordination: 6.1 } },
      { label: 'Na-Cl', firstPeak: { rA: 2.8, g: 4.1 }, firstMinimum: { rA: 3.6, coordination: 5.83 } },
      { label: 'Na-Na', firstPeak: null, firstMinimum: null },
    ] };
    const cards = headlineCards({ msd, vacf, rdf }, 'a2PerPs');
    expect(cards.map((c) => c.id)).toEqual(['msd', 'msd-species', 'vacf', 'vacf-species', 'coordination', 'coordination-pairs']);
    const bySpecies = cards.find((c) => c.id === 'msd-species')!;
    expect(bySpecies.unit).toBe('Å²/ps');
    expect(bySpecies.rows!.map((r) => [r.label, r.value])).toEqual([['Na', '0.210 ± 0.012'], ['Cl', '0.1100 ± 0.0090']]);
    expect(bySpecies.warning).toMatch(/MSD of Cl is not diffusive/);
    expect(cards.find((c) => c.id === 'vacf-species')!.rows!.map((r) => r.label)).toEqual(['Na', 'Cl']);
    const pairs = cards.find((c) => c.id === 'coordination-pairs')!;
    expect(pairs.rows).toEqual([
      { label: 'Na-Cl', value: '5.83', note: 'peak 2.8 Å, shell to 3.6 Å' },
      { label: 'Na-Na', value: '—', note: 'no shell above counting noise' },
    ]);
  });

  it('when a run holds one species, then no per-species card repeats the overall one', () => {
    const single: ReportSummary = { msd: { dimensions: 3, groups: [liquid.msd!.groups[0]!, { ...liquid.msd!.groups[0]!, label: 'Ar' }] }, rdf: { pairs: [{ label: 'all', firstPeak: null, firstMinimum: null }, { label: 'Ar-Ar', firstPeak: null, firstMinimum: null }] } };
    expect(headlineCards(single, 'a2PerPs').map((c) => c.id)).toEqual(['msd', 'coordination']);
  });
});
