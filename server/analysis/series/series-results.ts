/**
 * A series' results from its members' reports: state points, D(T) with its
 * Arrhenius fit, a phase per member with its evidence, melting and boiling
 * brackets, the caloric curve and Cv(T). Pure: the service gathers the
 * inputs, this turns them into numbers.
 */
import type { ReportSummary } from '../../../shared/report-summary.ts';
import type { Branch, MemberEnergy, SeriesMemberResult, SeriesResults } from '../../../shared/series-results.ts';
import { fitArrhenius } from './arrhenius-fit.ts';
import { caloricCurve, heatCapacityPoints } from './caloric.ts';
import { diffusionGroup, harmonicHeatCapacity, kineticEnergyPerAtom, lindemannRatio } from './member-readings.ts';
import { namePhases, type PhaseInput } from './phase.ts';
import { PHASE_CRITERIA } from './phase-criteria.ts';
import { rdfShape, type RdfCurveInput } from './rdf-shape.ts';
import { transitionBrackets } from './transition.ts';

export interface SeriesMemberInput {
  trajectoryId: number;
  name: string;
  position: number;
  branch: Branch | null;
  excludedFromFits: boolean;
  statedTemperatureK: number | null;
  statedPressureBar: number | null;
  atoms: number | null;
  speciesCounts: Readonly<Record<string, number>> | null;
  /** The member's report summary, or null while it has none. */
  summary: ReportSummary | null;
  rdfCurve: RdfCurveInput | null;
  /** Total energy per atom where the run has energies (overrides the kinetic reading). */
  totalEnergy?: MemberEnergy | null;
  cvFluctuationPerAtomKB?: { value: number; stdError: number | null } | null;
}

const temperatureError = (m: SeriesMemberResult): number | null => (m.temperatureSource === 'measured' ? (m.measuredTemperatureK?.stdError ?? null) : null);

const K = (t: number): string => `${Number(t.toPrecision(4))} K`;

function temperatureOf(m: SeriesMemberInput): Pick<SeriesMemberResult, 'temperatureK' | 'temperatureSource' | 'measuredTemperatureK' | 'statedTemperatureK'> {
  const measured = m.summary?.thermo?.temperatureK ?? null;
  if (measured && Number.isFinite(measured.mean) && measured.mean > 0) {
    return { temperatureK: measured.mean, temperatureSource: 'measured', measuredTemperatureK: measured, statedTemperatureK: m.statedTemperatureK };
  }
  if (m.statedTemperatureK !== null && m.statedTemperatureK > 0) {
    return { temperatureK: m.statedTemperatureK, temperatureSource: 'stated', measuredTemperatureK: null, statedTemperatureK: m.statedTemperatureK };
  }
  return { temperatureK: null, temperatureSource: 'none', measuredTemperatureK: null, statedTemperatureK: m.statedTemperatureK };
}

function notesFor(m: SeriesMemberInput, t: ReturnType<typeof temperatureOf>): string[] {
  const notes: string[] = [];
  if (!m.summary) return ['No report yet.'];
  const measured = t.measuredTemperatureK, stated = m.statedTemperatureK;
  if (measured && stated !== null && Math.abs(measured.mean - stated) > Math.max(3 * measured.stdError, 0.02 * stated)) {
    notes.push(`Measured ${K(measured.mean)} differs from the stated ${K(stated)}; the measured value is used.`);
  }
  if (t.temperatureSource === 'stated') notes.push('No temperature analysis: the stated temperature is used.');
  if (t.temperatureSource === 'none') notes.push('No temperature, stated or measured: the member is left out of D(T), brackets and curves.');
  const missing = (['thermo', 'msd', 'rdf', 'lindemann'] as const).filter((k) => !m.summary?.[k]);
  if (missing.length) notes.push(`The report has no ${missing.join(', ')} analysis.`);
  return notes;
}

export function seriesResults(inputs: readonly SeriesMemberInput[]): SeriesResults {
  const ordered = [...inputs].sort((a, b) => a.position - b.position);
  const readings = ordered.map((m) => {
    const t = temperatureOf(m);
    const group = diffusionGroup(m.summary);
    const rdf = m.summary?.rdf ? rdfShape(m.rdfCurve, m.summary.rdf.pairs, m.speciesCounts) : null;
    const phaseInput: PhaseInput = {
      d: group?.d?.a2PerPs ?? null, dStdError: group?.dStdError?.a2PerPs ?? null, regime: group?.regime ?? null, plateauA2: group?.plateauA2 ?? null,
      lindemannRatio: lindemannRatio(m.summary), rdf, densityGPerCm3: m.summary?.thermo?.densityGPerCm3?.mean ?? null,
      sqPeak: m.summary?.sq?.firstPeak ?? null, label: t.temperatureK !== null ? `${m.name} (${K(t.temperatureK)})` : m.name,
    };
    return { m, t, group, rdf, phaseInput };
  });
  const phases = namePhases(readings.map((r) => r.phaseInput));
  // One kind of energy for the whole curve: total only when every member with a report has it.
  const reported = readings.filter((r) => r.m.summary);
  const allTotal = reported.length > 0 && reported.every((r) => r.m.totalEnergy);

  const members: SeriesMemberResult[] = readings.map(({ m, t, group, rdf, phaseInput }, i) => ({
    trajectoryId: m.trajectoryId, name: m.name, position: m.position, branch: m.branch, excludedFromFits: m.excludedFromFits,
    ...t,
    densityGPerCm3: m.summary?.thermo?.densityGPerCm3 ?? null,
    pressureBar: m.statedPressureBar !== null ? { value: m.statedPressureBar, stdError: null, source: 'stated' } : null,
    d: group?.d ?? null, dStdError: group?.dStdError ?? null, motionRegime: group?.regime ?? null,
    lindemannRatio: phaseInput.lindemannRatio, rdfShape: rdf, sqPeak: phaseInput.sqPeak,
    energyPerAtom: allTotal ? (m.totalEnergy ?? null) : kineticEnergyPerAtom(m.summary, m.atoms),
    cvHarmonicPerAtomKB: harmonicHeatCapacity(m.summary),
    cvFluctuationPerAtomKB: m.cvFluctuationPerAtomKB ?? null,
    phase: phases[i],
    notes: notesFor(m, t),
  }));

  const withReports = members.filter((m, i) => readings[i].m.summary);
  const labelOf = (m: SeriesMemberResult): string => (m.temperatureK !== null ? `${K(m.temperatureK)}` : m.name);
  const arrhenius = fitArrhenius(withReports.map((m) => ({
    trajectoryId: m.trajectoryId, label: labelOf(m), temperatureK: m.temperatureK, temperatureStdError: temperatureError(m), d: m.d?.a2PerPs ?? null,
    dStdError: m.dStdError?.a2PerPs ?? null, phase: m.phase.phase, excluded: m.excludedFromFits,
  })));
  const transitionMembers = withReports.map((m) => ({ trajectoryId: m.trajectoryId, label: m.name, temperatureK: m.temperatureK, phase: m.phase.phase, branch: m.branch }));
  const melting = transitionBrackets(transitionMembers, 'melting');
  const boiling = transitionBrackets(transitionMembers, 'boiling');
  const caloricMembers = withReports.map((m) => ({
    trajectoryId: m.trajectoryId, label: m.name, temperatureK: m.temperatureK, temperatureStdError: temperatureError(m), energy: m.energyPerAtom, phase: m.phase.phase, branch: m.branch,
    excluded: m.excludedFromFits, cvFluctuationPerAtomKB: m.cvFluctuationPerAtomKB, cvHarmonicPerAtomKB: m.cvHarmonicPerAtomKB,
  }));
  const caloric = caloricCurve(caloricMembers, melting.brackets[0]);
  const heatCapacity = heatCapacityPoints(caloricMembers, caloric.energyKind);

  const warnings: string[] = [];
  const pending = members.length - withReports.length;
  if (pending > 0) warnings.push(`${pending} of ${members.length} members have no report yet; results use the others.`);
  if (withReports.filter((m) => m.temperatureK !== null).length < 2) warnings.push('Fewer than two members with a temperature: nothing to compare across temperature yet.');
  return { members, arrhenius, melting, boiling, caloric, heatCapacity, criteria: PHASE_CRITERIA, warnings };
}
