import type { EnergySummary } from '../../../shared/report-summary';
import { formatNumber } from './number-format';
import { isRecord, num, record, text, type Json } from './record-read';
import type { MethodsParagraph } from './methods-text';

const f = (x: number | null, digits = 5) => (x === null ? '?' : formatNumber(x, digits));

const TRUNCATION_WORDS: Record<string, string> = {
  truncated: 'truncated', shifted: 'shifted to zero at the cut-off', 'force-shifted': 'force-shifted (energy and force zero at the cut-off)',
};

/** One resolved pair in words: its form, parameters in eV and Å, cut-off convention, and where it came from. */
export function pairSentence(p: Json): string {
  const species = Array.isArray(p['species']) ? (p['species'] as unknown[]).join('–') : '?';
  const form = text(p, 'form');
  const params = form === 'lj' ? `LJ 12-6 with ε = ${f(num(p, 'epsilonEV'))} eV, σ = ${f(num(p, 'sigmaA'))} Å`
    : form === 'morse' ? `Morse with D = ${f(num(p, 'depthEV'))} eV, α = ${f(num(p, 'alphaPerA'))} Å⁻¹, r₀ = ${f(num(p, 'r0A'))} Å`
      : form === 'buckingham' ? `Buckingham exp-6 with A = ${f(num(p, 'aEV'))} eV, ρ = ${f(num(p, 'rhoA'))} Å, C = ${f(num(p, 'cEVA6'))} eV·Å⁶`
        : form === 'table' ? `tabulated U(r) (${f(num(p, 'points'), 6)} points, natural cubic spline, forces from its derivative)`
          : 'no interaction';
  if (form === 'none') return `${species}: no interaction`;
  const cut = `cut-off ${f(num(p, 'cutoffA'))} Å, ${TRUNCATION_WORDS[text(p, 'truncation') ?? 'truncated'] ?? text(p, 'truncation')}${p['tailCorrection'] === true ? ', with analytic tail corrections' : ''}`;
  const origin = text(p, 'origin') === 'mixed' ? ' (Lorentz–Berthelot mixing of the like pairs)' : '';
  return `${species}: ${params}, ${cut}${origin}`;
}

const POTENTIAL_WORDS: Record<string, string> = {
  model: 'from the interaction model', file: 'as the file states it', 'file total minus kinetic': 'as the file’s total energy minus the kinetic energy',
};

export function energyParagraph(s: EnergySummary, m: Json): MethodsParagraph {
  const model = record(m, 'interactionModel');
  const pairs = Array.isArray(m['resolvedPairs']) ? (m['resolvedPairs'] as unknown[]).filter(isRecord) : [];
  const name = text(model, 'name');
  const source = text(model, 'source');
  const modelText = pairs.length
    ? `Interaction model${name ? ` “${name}”` : ''}${source ? ` (${source})` : ''}: ${pairs.map(pairSentence).join('; ')}. `
      + `Pair sums by cell lists over the periodic cell, every image within the cut-off counted.${text(m, 'mixingRule') ? ` Mixing: ${text(m, 'mixingRule')}.` : ''} `
    : 'No interaction model: energies as the file states them. ';
  const keys = Array.isArray(record(m, 'sources')['fileKeys']) ? (record(m, 'sources')['fileKeys'] as unknown[]).filter(isRecord) : [];
  const fileText = keys.length
    ? `File values read: ${keys.map((k) => `${text(k, 'quantity')} from key “${text(k, 'key')}” in ${text(k, 'unit')}${k['guessed'] === true ? ' (guessed from the key name; map it in the trajectory metadata if wrong)' : ''}`).join('; ')}. `
    : '';
  const pressure = s.sources.pressure === 'virial' ? `Pressure from the virial: ${text(m, 'pressure') ?? ''}. ` : s.sources.pressure === 'file' ? 'Pressure as the file states it. ' : '';
  const threshold = record(m, 'nveThreshold');
  const drift = `Drift: ${text(m, 'drift') ?? 'line fit'}${s.nveCheck ? `; NVE check at ${f(num(threshold, 'kTPerNs'), 3)} k_BT per atom per ns (${text(threshold, 'source') ?? ''})` : ''}. `;
  const cv = s.heatCapacity
    ? `Heat capacity: ${s.heatCapacity.method} at ${f(s.heatCapacity.temperatureK, 4)} K, with the block error of the variance.`
    : `Heat capacity from fluctuations: ${s.heatCapacityNote ?? 'not computed'}.`;
  return {
    heading: 'Energy and pressure',
    body: `${modelText}${fileText}Kinetic energy from ${s.sources.kinetic}; potential energy ${POTENTIAL_WORDS[s.sources.potential ?? ''] ?? 'not available'}. ${pressure}`
      + `Means with ${text(m, 'averages') ?? 'block errors'}. ${drift}${cv}`,
  };
}
