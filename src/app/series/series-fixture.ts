import type { DiffusionValue } from '../../../shared/report-summary';
import type { PhaseName, SeriesMemberResult, SeriesResults } from '../../../shared/series-results';

/** D in the three units from Å²/ps: 1 Å²/ps = 10⁻⁸ m²/s = 10 × 10⁻⁹ m²/s = 10⁻⁴ cm²/s. */
export function diffusionValue(a2PerPs: number): DiffusionValue {
  return { a2PerPs, e9M2PerS: a2PerPs * 10, cm2PerS: a2PerPs * 1e-4 };
}

/** A member as the engine reports it, with only what a test names set. */
export function memberResult(over: Partial<SeriesMemberResult> & { trajectoryId: number; temperatureK: number | null; phase?: SeriesMemberResult['phase'] }): SeriesMemberResult {
  const phase: PhaseName = over.phase?.phase ?? 'unclear';
  return {
    name: `run-${over.trajectoryId}.extxyz`, position: over.trajectoryId, branch: null, excludedFromFits: false,
    temperatureSource: over.temperatureK === null ? 'none' : 'measured', statedTemperatureK: over.temperatureK,
    measuredTemperatureK: over.temperatureK === null ? null : { mean: over.temperatureK, stdError: 0.5 },
    densityGPerCm3: null, pressureBar: null, d: null, dStdError: null, motionRegime: null, lindemannRatio: null, rdfShape: null, sqPeak: null,
    energyPerAtom: null, cvHarmonicPerAtomKB: null, cvFluctuationPerAtomKB: null,
    phase: { phase, reason: `named ${phase} for the test`, evidence: [] }, notes: [],
    ...over,
  };
}

/** Results with the given members and nothing fitted or bracketed, for tests to fill in. */
export function emptyResults(members: SeriesMemberResult[]): SeriesResults {
  const transition = (kind: 'melting' | 'boiling') => ({
    kind, lowPhase: kind === 'melting' ? 'solid' as const : 'liquid' as const, highPhase: kind === 'melting' ? 'liquid' as const : 'vapour' as const,
    brackets: [], hysteresisBounds: null, caution: 'Heating a perfect crystal overshoots; cooling undershoots.',
  });
  return {
    members,
    arrhenius: { status: 'not-enough-points', message: 'Fewer than two points.', activationEnergy: null, activationEnergyStdError: null, d0: null, d0StdError: null, rangeK: null, points: [], leftOut: [], chiSquared: null, degreesOfFreedom: 0, errorMethod: 'none', warnings: [] },
    melting: transition('melting'), boiling: transition('boiling'),
    caloric: { energyKind: 'none', note: '', points: [], latentHeat: null, latentHeatNote: '' },
    heatCapacity: [],
    criteria: {
      mobilitySigmas: 2, lindemannSolidBelow: 0.15, lindemannFluidAbove: 0.3, rdfOrderedBelow: 0.14, rdfGasAbove: 0.4, packingCondensedAbove: 0.6,
      packingDiluteBelow: 0.3, densityCondensedFraction: 0.6, densityDiluteFraction: 0.35, structureFactorFreezing: 2.85, structureFactorGasBelow: 1.3,
    },
    warnings: [],
  };
}
