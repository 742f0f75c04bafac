import { describe, expect, it } from 'vitest';
import type { EnergySummary, ReportSummary } from '../../../shared/report-summary';
import { energyCards } from './energy-cards';

const mean = (m: number, s: number) => ({ mean: m, stdError: s });

function summary(over: Partial<EnergySummary> = {}): EnergySummary {
  return {
    atoms: 256, ensemble: 'NVE', sources: { potential: 'model', kinetic: 'stored velocities', pressure: 'virial' },
    potentialPerAtomEV: mean(-0.0612, 0.0003), kineticPerAtomEV: mean(0.0116, 0.0001), totalPerAtomEV: mean(-0.0496, 0.00001),
    temperatureK: mean(90, 0.5), pressureBar: mean(420, 12),
    pressureTensorBar: { xx: mean(410, 20), yy: mean(425, 20), zz: mean(425, 20), xy: mean(3, 5), xz: mean(-8, 5), yz: mean(1, 5) },
    tail: null, drift: { perAtomEVPerNs: 2.1e-4, stdError: 2e-5, relativeFluctuation: 3e-5, fluctuationRatio: 0.02, totalStdPerAtomEV: 1.5e-6 },
    nveCheck: { thresholdKTPerNs: 0.01, thresholdEVPerAtomPerNs: 7.8e-5, thresholdSource: 'default (common practice)', status: 'exceeds' },
    heatCapacity: { quantity: 'C_V', method: 'microcanonical kinetic-energy fluctuation (Lebowitz–Percus–Verlet)', temperatureK: 90, perAtomKB: mean(2.6, 0.1), jPerMolK: mean(21.6, 0.8), jPerGK: mean(0.54, 0.02) },
    heatCapacityNote: null, comparisons: [], ...over,
  };
}

describe('energy cards', () => {
  it('when the run is NVE and drifts beyond the threshold, then the drift card warns and says the default threshold is a rule of thumb the user can change', () => {
    const cards = energyCards({ energy: summary() });
    expect(cards.map((c) => c.id)).toEqual(['energy-potential', 'energy-pressure', 'energy-drift', 'energy-cv']);
    const drift = cards.find((c) => c.id === 'energy-drift')!;
    expect(drift.warning).toMatch(/not conserved/);
    expect(drift.detail).toMatch(/beyond the threshold of 0.01 k_BT per atom per ns .*rule of thumb.*set your own/);
  });

  it('when the VDOS ran too, then the heat-capacity card sets the harmonic value beside the fluctuation value and says what the difference means', () => {
    const vdos = { cv: { classical: { perAtomKB: 3, jPerMolK: 24.9, jPerGK: 0.62 }, quantum: { perAtomKB: 2.98, jPerMolK: 24.8, jPerGK: 0.62 } } } as unknown as ReportSummary['vdos'];
    const cv = energyCards({ energy: summary({ heatCapacity: { ...summary().heatCapacity!, perAtomKB: mean(3.4, 0.1) } }), vdos }).find((c) => c.id === 'energy-cv')!;
    expect(cv.value).toBe('3.40 ± 0.10');
    expect(cv.detail).toMatch(/Harmonic value from the VDOS: 3 k_B per atom classical, 2.98 quantum/);
    expect(cv.detail).toMatch(/exceeds the classical harmonic one by 0.40 ± 0.10 k_B per atom: that excess is anharmonicity/);
  });

  it('when the file and the model disagree, then the potential card warns with both values', () => {
    const c = energyCards({ energy: summary({ comparisons: [{ quantity: 'potential energy', unit: 'eV/atom', fileMean: -0.0512, modelMean: -0.0612, meanDifference: 0.01, rmsDifference: 1e-6, tolerance: 1e-4, agree: false }] }) })[0]!;
    expect(c.warning).toMatch(/File and model disagree on the potential energy: file -0.0512 eV\/atom, model -0.0612 eV\/atom/);
  });

  it('when the pressure comes from the file and there is no model, then the card is titled so and its detail says what is shown and why there is no tensor', () => {
    const note = 'Shown: the pressure as the file states it, key "press" in bar, a scalar per frame without a tensor; there is no interaction model, so no virial pressure and no pressure tensor (both need the pair forces).';
    const p = energyCards({ energy: summary({ sources: { potential: 'file', kinetic: 'stored velocities', pressure: 'file' }, pressureTensorBar: null, pressureNote: note }) })
      .find((c) => c.id === 'energy-pressure')!;
    expect(p.title).toBe('Pressure (from the file)');
    expect(p.value).toBe('420 ± 12');
    expect(p.detail).toBe(note);
  });

  it('when the model gives the virial and the file no pressure, then the card shows the tensor and says there is nothing to compare with', () => {
    const p = energyCards({ energy: summary({ pressureNote: 'Shown: the virial pressure and its tensor from the interaction model; the file states no pressure to compare it with.' }) })
      .find((c) => c.id === 'energy-pressure')!;
    expect(p.title).toBe('Virial pressure');
    expect(p.detail).toMatch(/diagonal 410, 425, 425 bar.*\. Shown: the virial pressure and its tensor from the interaction model; the file states no pressure to compare it with\.$/);
  });

  it('when there is no pressure at all, then the card stays and says why instead of a number', () => {
    const note = 'No pressure: the file states none, and the model\'s virial pressure and tensor need a periodic cell volume, and this run has open boundaries.';
    const p = energyCards({ energy: summary({ pressureBar: null, pressureTensorBar: null, sources: { potential: 'model', kinetic: 'stored velocities', pressure: null }, pressureNote: note }) })
      .find((c) => c.id === 'energy-pressure')!;
    expect([p.value, p.detail]).toEqual(['—', note]);
  });

  it('when the file\'s pressure and the virial disagree, then the pressure card warns with both values', () => {
    const p = energyCards({ energy: summary({ comparisons: [{ quantity: 'pressure', unit: 'bar', fileMean: 1.013, modelMean: 420, meanDifference: -419, rmsDifference: 30, tolerance: 5, agree: false }] }) })
      .find((c) => c.id === 'energy-pressure')!;
    expect(p.warning).toMatch(/File and model disagree on the pressure: file 1.013 bar, model 420 bar/);
  });

  it('when there is no ensemble, then the heat-capacity card shows the reason instead of a number', () => {
    const c = energyCards({ energy: summary({ heatCapacity: null, heatCapacityNote: 'Set the run’s ensemble.', nveCheck: null }) }).find((x) => x.id === 'energy-cv')!;
    expect(c.value).toBe('—');
    expect(c.detail).toBe('Set the run’s ensemble.');
  });
});
