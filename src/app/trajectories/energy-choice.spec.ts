import { describe, expect, it } from 'vitest';
import { buildParams, type AdvancedSettings } from './analysis-params-form';
import { unavailableReason } from './analysis-choices';

const base = { cell: [10, 0, 0, 0, 10, 0, 0, 0, 10], boundary: 'periodic', frames: 100 };

describe('the energy choice of the analysis checklist', () => {
  it('when a trajectory has neither a model nor file energies, then energy is unavailable and says how to give it one', () => {
    expect(unavailableReason('energy', { ...base, interactionModelSource: null, fileValues: ['step_note'], fileQuantities: null })).toMatch(/needs an interaction model/);
    expect(unavailableReason('energy', { ...base, interactionModelSource: 'project', fileValues: [], fileQuantities: null })).toBeNull();
    expect(unavailableReason('energy', { ...base, interactionModelSource: null, fileValues: ['energy'], fileQuantities: null })).toBeNull();
    expect(unavailableReason('energy', { ...base, interactionModelSource: null, fileValues: ['etot'], fileQuantities: { totalEnergy: { key: 'etot', unit: 'eV' } } })).toBeNull();
  });

  it('when the drift threshold and barostat pressure are given, then they reach the parameters; blank leaves the defaults', () => {
    const settings = {
      fromFrame: null, toFrame: null, frameStride: null, discardPs: null, species: [], maxLagPs: null, removeComDrift: true, fitMode: 'auto', fitStartPs: null, fitEndPs: null, gkMode: 'auto', gkStartPs: null, gkEndPs: null,
      window: 'hann', zeroPadFactor: 1, temperatureK: null, degreesOfFreedom: null, constraints: 0, rMaxA: null, binWidthA: 0.05, pair: null, sqWindow: 'lorch',
    } satisfies AdvancedSettings;
    expect(buildParams({ ...settings, driftThresholdKTPerNs: 0.05, externalPressureBar: 1.01325 }).params).toMatchObject({ driftThresholdKTPerNs: 0.05, externalPressureBar: 1.01325 });
    expect(buildParams(settings).params).not.toHaveProperty('driftThresholdKTPerNs');
  });
});
