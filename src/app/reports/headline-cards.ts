import type { DiffusionValue, MsdGroupSummary, ReportSummary } from '../../../shared/report-summary';
import { energyCards } from './energy-cards';
import { formatNumber, formatWithError } from './number-format';
import { diffusionLabel, type DiffusionUnit } from './report-units';

/** One headline number as the cards show it. */
export interface HeadlineCard {
  id:
    | 'msd' | 'msd-species' | 'vacf' | 'vacf-species' | 'thermo' | 'vdos-peaks' | 'cv' | 'entropy' | 'zero-point' | 'coordination' | 'coordination-pairs'
    | 'sq-peak' | 'ngp-peak' | 'lindemann' | 'energy-potential' | 'energy-pressure' | 'energy-drift' | 'energy-cv';
  title: string;
  value: string;
  unit: string;
  /** One number per species or pair, when the card holds several (the unit is the card's). */
  rows?: HeadlineRow[];
  /** What the number rests on, in one line. */
  detail: string;
  /** A warning a reader must not miss (not converged, melted, drifting). */
  warning: string | null;
}

/** One labelled number inside a card. */
export interface HeadlineRow {
  label: string;
  value: string;
  /** A few words on what the number rests on. */
  note: string;
}

const REGIME_WORDS: Record<MsdGroupSummary['regime'], string> = {
  diffusive: 'diffusive', subdiffusive: 'subdiffusive', superdiffusive: 'superdiffusive', bounded: 'bounded (no long-time diffusion)', 'too-short': 'run too short to reach diffusion',
};

const span = (w: { start: number; end: number }) => `${formatNumber(w.start, 3)}–${formatNumber(w.end, 3)} ps`;

function withError(d: DiffusionValue | null, err: DiffusionValue | null, unit: DiffusionUnit): string {
  return d ? formatWithError(d[unit], err?.[unit]) : '—';
}

/** Where a ± came from, in a few words. */
export function errorSource(method: string | undefined, blocks: number | undefined): string {
  const n = blocks ? `${blocks} ` : '';
  switch (method) {
    case 'atom-blocks': return `± from ${n}independent groups of atoms`;
    case 'time-blocks': return `± from ${n}independent stretches of atoms and time origins`;
    case 'fit-residuals': return '± from the fit residuals';
    default: return 'no statistical error available';
  }
}

function msdCard(s: NonNullable<ReportSummary['msd']>, unit: DiffusionUnit): HeadlineCard {
  const g = s.groups[0]!;
  const detail = g.d
    ? `Einstein fit over ${span(g.fitWindowPs)}, log–log slope ${formatNumber(g.slopeExponent, 2)}, ${REGIME_WORDS[g.regime]}; ${errorSource(g.uncertaintyMethod, g.uncertaintyBlocks)}`
    : g.plateauA2 !== null ? `MSD levels off near ${formatNumber(g.plateauA2, 3)} Å²: ${REGIME_WORDS[g.regime]}` : REGIME_WORDS[g.regime];
  const warning = g.d && g.regime !== 'diffusive' ? `The MSD is ${g.regime} over the fit window; D may not be a long-time value.` : null;
  // A slab: which directions D is over, and why, where the directions differ.
  const slab = s.partlyPeriodic ? ` · ${s.partlyPeriodic.note}` : '';
  const title = s.partlyPeriodic && s.components ? `D from MSD (Einstein, along ${[...s.components].join(', ')})` : 'D from MSD (Einstein)';
  return { id: 'msd', title, value: withError(g.d, g.dStdError, unit), unit: g.d ? diffusionLabel(unit) : '', detail: detail + slab, warning };
}

/** The other groups of a multi-species run: one per species (the first group pools the selection). */
const speciesGroups = <G extends { label: string }>(groups: readonly G[]): G[] => groups.filter((g) => g.label !== 'all');

function msdSpeciesCard(s: NonNullable<ReportSummary['msd']>, unit: DiffusionUnit): HeadlineCard {
  const groups = speciesGroups(s.groups);
  const unsettled = groups.filter((g) => g.d && g.regime !== 'diffusive').map((g) => g.label);
  return {
    id: 'msd-species', title: 'D by species (MSD)', value: '', unit: diffusionLabel(unit),
    rows: groups.map((g) => ({
      label: g.label, value: withError(g.d, g.dStdError, unit),
      note: g.d ? `${g.atoms} atoms, fit over ${span(g.fitWindowPs)}` : `${g.atoms} atoms, ${REGIME_WORDS[g.regime]}`,
    })),
    detail: `Each species fitted on its own; ${errorSource(groups[0]?.uncertaintyMethod, undefined)}`,
    warning: unsettled.length ? `The MSD of ${unsettled.join(', ')} is not diffusive over its fit window.` : null,
  };
}

function vacfSpeciesCard(s: NonNullable<ReportSummary['vacf']>, unit: DiffusionUnit): HeadlineCard {
  const groups = speciesGroups(s.groups);
  const unsettled = groups.filter((g) => !g.converged).map((g) => g.label);
  return {
    id: 'vacf-species', title: 'D by species (VACF)', value: '', unit: diffusionLabel(unit),
    rows: groups.map((g) => ({ label: g.label, value: withError(g.dGreenKubo, g.dStdError ?? null, unit), note: `${g.atoms} atoms, plateau ${span(g.plateauWindowPs)}` })),
    detail: 'Green–Kubo integral of each species’ own velocity autocorrelation',
    warning: unsettled.length ? `The running integral of ${unsettled.join(', ')} has not settled to a plateau.` : null,
  };
}

function vacfCard(s: NonNullable<ReportSummary['vacf']>, unit: DiffusionUnit): HeadlineCard {
  const g = s.groups[0]!;
  // Reports before engine 0.2 carry only the plateau's spread, which is not an error bar: show no ± for them.
  const error = g.dStdError === undefined ? null : g.dStdError;
  return {
    id: 'vacf', title: 'D from VACF (Green–Kubo)', value: withError(g.dGreenKubo, error, unit), unit: diffusionLabel(unit),
    detail: `Running integral read over ${span(g.plateauWindowPs)}; ${g.dStdError === undefined ? `its spread there is ${formatNumber(g.spread[unit], 2)} (not an error bar)` : errorSource(g.uncertaintyMethod, g.uncertaintyBlocks)}`,
    warning: g.converged ? null : 'The running integral has not settled to a plateau.',
  };
}

/** Several warnings as one line; null when there are none. */
function joined(warnings: readonly (string | null | undefined)[]): string | null {
  const present = warnings.filter((w): w is string => !!w);
  return present.length ? present.join(' ') : null;
}

function fromPositions(source: string | undefined, factor: number | undefined): string {
  return source === 'central-differences' && factor !== undefined ? `; velocities from positions, finite-difference damping corrected (×${formatNumber(factor, 3)})` : '';
}

/** "3·128 − 128 constraints − 3 (centre of mass) = 253 degrees of freedom": the count and the rule behind it. */
function dofText(s: NonNullable<ReportSummary['thermo']>): string {
  const rule = s.degreesOfFreedomRule;
  return !rule || rule.startsWith('given') ? `${s.degreesOfFreedom} degrees of freedom${rule ? ' (as given)' : ''}` : `${rule} degrees of freedom`;
}

function thermoCard(s: NonNullable<ReportSummary['thermo']>): HeadlineCard {
  const density = s.densityGPerCm3 ? ` · density ${formatWithError(s.densityGPerCm3.mean, s.densityGPerCm3.stdError)} g/cm³` : '';
  const stated = s.statedTemperatureK ? ` · stated ${formatNumber(s.statedTemperatureK, 4)} K` : '';
  return {
    id: 'thermo', title: 'Mean temperature', value: formatWithError(s.temperatureK.mean, s.temperatureK.stdError), unit: 'K',
    detail: `Equipartition with ${dofText(s)}; blocking error${fromPositions(s.velocitySource, s.differenceCorrection)}${stated}${density}`,
    warning: joined([...(s.warnings ?? []), s.equilibrated ? null : 'Temperature or density drifts between the first and last third of the run.', discardAdvice(s)]),
  };
}

/** The discard the thermo check suggests for a drifting run, in the words of the analysis dialog's field. */
function discardAdvice(s: NonNullable<ReportSummary['thermo']>): string | null {
  if (s.equilibrated || !s.suggestedDiscardPs) return null;
  return `The temperature settles after about ${formatNumber(s.suggestedDiscardPs, 3)} ps from the start of the range: analyse again with “Discard for equilibration” set to ${formatNumber(s.suggestedDiscardPs, 3)} ps.`;
}

/** Names the temperature a harmonic quantity was evaluated at, and the stated one beside it. */
function temperatureUsed(s: NonNullable<ReportSummary['vdos']>): string {
  const source = s.temperatureSource === 'chosen' ? 'the temperature chosen for this analysis' : s.temperatureSource === 'kinetic' ? 'the kinetic temperature' : 'the analysis temperature';
  const stated = s.statedTemperatureK ? `; stated ${formatNumber(s.statedTemperatureK, 4)} K` : '';
  const kinetic = s.temperatureSource === 'chosen' && s.kineticTemperatureK !== undefined ? `; kinetic ${formatNumber(s.kineticTemperatureK, 4)} K` : '';
  return `at ${formatNumber(s.temperatureK, 4)} K, ${source}${kinetic}${stated}`;
}

function vdosCards(s: NonNullable<ReportSummary['vdos']>): HeadlineCard[] {
  const peaks = s.peaks.slice(0, 3);
  const T = formatNumber(s.temperatureK, 4);
  const e = s.stdErrors ?? null;
  const blocks = e ? `; ± from ${e.blocks} independent groups of atoms` : '';
  return [
    {
      id: 'vdos-peaks', title: 'VDOS peaks', value: peaks.length ? peaks.map((p) => formatWithError(p.cm1, p.cm1StdError)).join(', ') : '—', unit: peaks.length ? 'cm⁻¹' : '',
      detail: peaks.length ? `${peaks.map((p) => formatNumber(p.thz, 3)).join(', ')} THz · ${peaks.map((p) => formatNumber(p.meV, 3)).join(', ')} meV${blocks}` : 'No peak stands out of the spectrum',
      warning: joined(s.warnings ?? []),
    },
    {
      id: 'cv', title: `Heat capacity Cv at ${T} K`, value: formatWithError(s.cv.quantum.perAtomKB, e?.cvPerAtomKB), unit: 'k_B per atom',
      detail: `Quantum harmonic ${temperatureUsed(s)}; ${formatNumber(s.cv.quantum.jPerMolK, 4)} J/(mol·K), ${formatNumber(s.cv.quantum.jPerGK, 4)} J/(g·K). Classical limit ${formatNumber(s.cv.classical.perAtomKB, 4)} k_B per atom${blocks}`,
      warning: joined([s.temperatureWarning, ...(s.warnings ?? [])]),
    },
    {
      id: 'entropy', title: `Vibrational entropy at ${T} K`, value: formatWithError(s.entropy.quantum.perAtomKB, e?.entropyPerAtomKB), unit: 'k_B per atom',
      detail: `Quantum harmonic ${temperatureUsed(s)}; ${formatNumber(s.entropy.quantum.jPerMolK, 4)} J/(mol·K). Classical ${formatNumber(s.entropy.classical.perAtomKB, 4)} k_B per atom${blocks}`,
      warning: joined([s.temperatureWarning]),
    },
    {
      // meV reads better than eV at the size zero-point energies of atoms have.
      id: 'zero-point', title: 'Zero-point energy', value: formatWithError(s.zeroPoint.evPerAtom * 1e3, e ? e.zeroPointEvPerAtom * 1e3 : null), unit: 'meV per atom',
      detail: `Half a quantum, ½hν, for each of the ${formatNumber(s.modes, 6)} modes of the spectrum; ${formatNumber(s.zeroPoint.kJPerMol, 4)} kJ/mol${blocks}`,
      warning: null,
    },
  ];
}

function coordinationCard(s: NonNullable<ReportSummary['rdf']>): HeadlineCard {
  if (s.refused) return { id: 'coordination', title: 'First-shell coordination', value: '—', unit: '', detail: 'g(r) not computed', warning: s.refused };
  const p = s.pairs[0]!;
  const shell = p.firstMinimum;
  const detail = !p.firstPeak
    ? 'No shell: g(r) has no peak standing above its counting noise, so there is no coordination number to give'
    : shell
      ? `g(r) peaks at ${formatNumber(p.firstPeak.rA, 3)} Å; shell ends at the first minimum, ${formatNumber(shell.rA, 3)} Å`
      : `g(r) peaks at ${formatNumber(p.firstPeak.rA, 3)} Å, but no first minimum stands out inside r_max`;
  return {
    id: 'coordination', title: 'First-shell coordination', value: shell ? formatNumber(shell.coordination, 3) : '—', unit: shell ? 'neighbours' : '',
    detail,
    warning: null,
  };
}

function coordinationPairsCard(s: NonNullable<ReportSummary['rdf']>): HeadlineCard {
  const pairs = speciesGroups(s.pairs);
  return {
    id: 'coordination-pairs', title: 'Coordination by species pair', value: '', unit: '',
    rows: pairs.map((p) => ({
      label: p.label,
      value: p.firstMinimum ? formatNumber(p.firstMinimum.coordination, 3) : '—',
      note: !p.firstPeak ? 'no shell above counting noise' : p.firstMinimum
        ? `peak ${formatNumber(p.firstPeak.rA, 3)} Å, shell to ${formatNumber(p.firstMinimum.rA, 3)} Å`
        : `peak ${formatNumber(p.firstPeak.rA, 3)} Å, no first minimum inside r_max`,
    })),
    detail: 'Neighbours of the second species around an atom of the first, counted to the first minimum of that pair’s g(r)',
    warning: null,
  };
}

function sqCard(s: NonNullable<ReportSummary['sq']>): HeadlineCard {
  if (s.refused) return { id: 'sq-peak', title: 'First peak of S(q)', value: '—', unit: '', detail: 'S(q) not computed', warning: s.refused };
  const p = s.firstPeak;
  return {
    id: 'sq-peak', title: 'First peak of S(q)', value: p ? formatNumber(p.qInvA, 4) : '—', unit: p ? 'Å⁻¹' : '',
    detail: p
      ? `S(q) = ${formatNumber(p.s, 3)} there; a spacing of about 2π/q = ${formatNumber((2 * Math.PI) / p.qInvA, 3)} Å`
      : 'No peak stands out of S(q) inside the q range',
    warning: null,
  };
}

function ngpCard(s: NonNullable<ReportSummary['ngp']>): HeadlineCard {
  const groups = s.groups ?? [];
  const several = groups.length > 1;
  const peak = (alpha: number | null) => (alpha === null ? '—' : formatNumber(alpha, 3));
  const at = (lag: number | null) => (lag === null ? 'no peak inside the lags' : `at ${formatNumber(lag, 3)} ps`);
  const single = groups[0] ?? { label: 'all', atoms: 0, peakAlpha2: s.peakAlpha2, peakLagPs: s.peakLagPs };
  return {
    id: 'ngp-peak', title: several ? 'Peak of α₂ by species' : 'Peak of the non-Gaussian parameter α₂',
    value: several ? '' : peak(single.peakAlpha2), unit: '',
    rows: several ? groups.map((g) => ({ label: g.label, value: peak(g.peakAlpha2), note: `${g.atoms} atoms, ${at(g.peakLagPs)}` })) : undefined,
    detail: several
      ? 'Largest α₂(t) of each species; 0 for Gaussian displacements, larger when some atoms move much farther than others'
      : `${at(single.peakLagPs)}; 0 for Gaussian displacements, larger when some atoms move much farther than others`,
    warning: null,
  };
}

const LINDEMANN_FORMS = {
  'per-atom': 'rms displacement of each atom about its mean position over the nearest-neighbour distance (bulk form)',
  'all-pairs': 'fluctuation of every interatomic distance over its mean (cluster form)',
} as const;

function lindemannCard(s: NonNullable<ReportSummary['lindemann']>): HeadlineCard {
  const form = s.form ? `${LINDEMANN_FORMS[s.form]}${s.nearestNeighbourA ? `, r_nn = ${formatNumber(s.nearestNeighbourA, 3)} Å` : ''}. ` : '';
  return {
    id: 'lindemann', title: 'Lindemann index', value: formatNumber(s.index, 3), unit: '',
    detail: `${form}${s.melted ? 'Above' : 'Below'} the melting threshold ${formatNumber(s.threshold, 2)} for this form: ${s.melted ? 'liquid-like' : 'solid-like'}`,
    warning: s.melted ? 'Melted: atoms wander beyond the Lindemann threshold.' : null,
  };
}

/** The report's headline numbers in reading order, D shown in `unit`; analyses that did not run have no card. */
export function headlineCards(summary: ReportSummary, unit: DiffusionUnit): HeadlineCard[] {
  return [
    ...(summary.msd?.groups.length ? [msdCard(summary.msd, unit)] : []),
    ...(summary.msd && speciesGroups(summary.msd.groups).length > 1 ? [msdSpeciesCard(summary.msd, unit)] : []),
    ...(summary.vacf?.groups.length ? [vacfCard(summary.vacf, unit)] : []),
    ...(summary.vacf && speciesGroups(summary.vacf.groups).length > 1 ? [vacfSpeciesCard(summary.vacf, unit)] : []),
    ...(summary.thermo ? [thermoCard(summary.thermo)] : []),
    ...(summary.vdos ? vdosCards(summary.vdos) : []),
    ...(summary.rdf?.pairs.length || summary.rdf?.refused ? [coordinationCard(summary.rdf)] : []),
    ...(summary.rdf && speciesGroups(summary.rdf.pairs).length > 1 ? [coordinationPairsCard(summary.rdf)] : []),
    ...(summary.sq ? [sqCard(summary.sq)] : []),
    ...(summary.ngp ? [ngpCard(summary.ngp)] : []),
    ...(summary.lindemann ? [lindemannCard(summary.lindemann)] : []),
    ...energyCards(summary),
  ];
}
