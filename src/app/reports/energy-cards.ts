import type { EnergySummary, ReportSummary } from '../../../shared/report-summary';
import type { HeadlineCard } from './headline-cards';
import { formatNumber, formatWithError } from './number-format';

const SOURCE_WORDS: Record<string, string> = {
  model: 'from the interaction model', file: 'from the file', 'file total minus kinetic': 'from the file’s total energy minus the kinetic energy',
};

function comparisonWarning(e: EnergySummary, quantity: 'potential energy' | 'pressure'): string | null {
  const c = e.comparisons.find((x) => x.quantity === quantity);
  if (!c || c.agree) return null;
  const d = c.unit === 'bar' ? 4 : 5;
  return `File and model disagree on the ${quantity}: file ${formatNumber(c.fileMean, d)} ${c.unit}, model ${formatNumber(c.modelMean, d)} ${c.unit} `
    + `(mean difference ${formatNumber(c.meanDifference, 3)}, frame-to-frame scatter ${formatNumber(c.rmsDifference, 3)} ${c.unit}). Check units, cut-off, shift and tail conventions.`;
}

function comparisonNote(e: EnergySummary, quantity: 'potential energy' | 'pressure'): string {
  const c = e.comparisons.find((x) => x.quantity === quantity);
  return c?.agree ? `; the file's ${quantity} agrees (${formatNumber(c.fileMean, 5)} ${c.unit})` : '';
}

function potentialCard(e: EnergySummary): HeadlineCard {
  const u = e.potentialPerAtomEV;
  const tail = e.tail ? `, tail correction ${formatNumber(e.tail.energyPerAtomEV, 3)} eV/atom included` : '';
  const total = e.totalPerAtomEV ? ` · total ${formatWithError(e.totalPerAtomEV.mean, e.totalPerAtomEV.stdError)} eV/atom` : '';
  return {
    id: 'energy-potential', title: 'Potential energy', value: u ? formatWithError(u.mean, u.stdError) : '—', unit: u ? 'eV per atom' : '',
    detail: `${SOURCE_WORDS[e.sources.potential ?? ''] ?? 'not available'}${tail}${total}${comparisonNote(e, 'potential energy')}`,
    warning: comparisonWarning(e, 'potential energy'),
  };
}

function pressureCard(e: EnergySummary): HeadlineCard {
  const p = e.pressureBar;
  if (!p) return { id: 'energy-pressure', title: 'Pressure', value: '—', unit: '', detail: e.pressureNote ?? 'Not available', warning: null };
  const t = e.pressureTensorBar;
  const tensor = t ? ` · diagonal ${[t.xx, t.yy, t.zz].map((c) => formatNumber(c.mean, 3)).join(', ')} bar; largest shear ${formatNumber(Math.max(...[t.xy, t.xz, t.yz].map((c) => Math.abs(c.mean))), 3)} bar` : '';
  const tail = e.tail ? `, tail ${formatNumber(e.tail.pressureBar, 3)} bar included` : '';
  return {
    id: 'energy-pressure', title: e.sources.pressure === 'virial' ? 'Virial pressure' : 'Pressure (from the file)',
    value: formatWithError(p.mean, p.stdError), unit: 'bar',
    // The note says what is shown and why the rest is missing; a file's pressure needs nothing else.
    detail: e.sources.pressure === 'virial'
      ? `Kinetic plus pair virial over the cell volume${tail}${tensor}${comparisonNote(e, 'pressure')}.${e.pressureNote ? ` ${e.pressureNote}` : ''}`
      : e.pressureNote ?? 'As the file states it.',
    warning: comparisonWarning(e, 'pressure'),
  };
}

const STATUS_WORDS = {
  within: 'within', exceeds: 'beyond', inconclusive: 'not distinguishable from',
} as const;

/** Where the kinetic energy came from when the file has no velocities: differences of positions, and their correction. */
function kineticFrom(e: EnergySummary): string {
  return e.sources.kinetic.startsWith('differences of positions') ? ` Kinetic energy from ${e.sources.kinetic}.` : '';
}

function driftCard(e: EnergySummary): HeadlineCard {
  const d = e.drift!;
  const check = e.nveCheck;
  const threshold = check
    ? ` NVE check: ${STATUS_WORDS[check.status]} the threshold of ${formatNumber(check.thresholdKTPerNs, 3)} k_BT per atom per ns (${formatNumber(check.thresholdEVPerAtomPerNs, 3)} eV)`
      + `${check.thresholdSource.startsWith('default') ? ', a rule of thumb of the trade; set your own in the analysis settings' : ', as set for this run'}.`
    : '';
  return {
    id: 'energy-drift', title: 'Total-energy drift', value: formatWithError(d.perAtomEVPerNs, d.stdError), unit: 'eV per atom per ns',
    detail: `Line fit to the total energy per atom; its fluctuation is ${formatNumber(d.fluctuationRatio, 3)} of the kinetic energy's (σ_E/σ_K) and ${formatNumber(d.relativeFluctuation, 3)} of |E|.${threshold}${kineticFrom(e)}`,
    warning: check?.status === 'exceeds' ? 'Energy is not conserved well enough for an NVE run: shorten the time step, tighten constraints or smooth the cut-off.'
      : check?.status === 'inconclusive' ? 'The run is too short to tell whether the drift stays within the threshold.' : null,
  };
}

function heatCapacityCard(summary: ReportSummary, e: EnergySummary): HeadlineCard {
  const h = e.heatCapacity;
  const harmonic = summary.vdos?.cv;
  if (!h) {
    return { id: 'energy-cv', title: 'Heat capacity from fluctuations', value: '—', unit: '', detail: e.heatCapacityNote ?? 'Not available', warning: null };
  }
  const symbol = h.quantity === 'C_P' ? 'C_P' : 'C_V';
  let beside = '';
  if (harmonic) {
    const diff = h.perAtomKB.mean - harmonic.classical.perAtomKB;
    beside = ` Harmonic value from the VDOS: ${formatNumber(harmonic.classical.perAtomKB, 4)} k_B per atom classical, ${formatNumber(harmonic.quantum.perAtomKB, 4)} quantum. `
      + `The fluctuation value exceeds the classical harmonic one by ${formatWithError(diff, h.perAtomKB.stdError)} k_B per atom: `
      + `that excess is anharmonicity (in a liquid, also the configurational part a set of oscillators cannot hold)`
      + `${h.quantity === 'C_P' ? ', plus the expansion work C_P − C_V' : ''}; a classical harmonic crystal gives zero.`;
  }
  return {
    id: 'energy-cv', title: `${symbol} from energy fluctuations at ${formatNumber(h.temperatureK, 4)} K`,
    value: formatWithError(h.perAtomKB.mean, h.perAtomKB.stdError), unit: 'k_B per atom',
    detail: `${h.method}, block error; ${formatWithError(h.jPerMolK.mean, h.jPerMolK.stdError)} J/(mol·K).${beside}`,
    warning: null,
  };
}

/** Cards of the energy analysis: potential energy, pressure, drift with the NVE check, fluctuation heat capacity. */
export function energyCards(summary: ReportSummary): HeadlineCard[] {
  const e = summary.energy;
  if (!e) return [];
  return [
    potentialCard(e),
    // Without any pressure the card stays, to say why (no model, open boundaries, nothing in the file).
    ...(e.pressureBar || e.pressureNote ? [pressureCard(e)] : []),
    ...(e.drift ? [driftCard(e)] : []),
    heatCapacityCard(summary, e),
  ];
}
