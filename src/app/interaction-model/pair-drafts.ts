/**
 * The interaction-model editor's working copy: one draft per pair with the
 * units chosen once per pair, turned into the shared schema's input (units in
 * the field names) and back. Validation is the shared schema's own, so the
 * editor, the API and the command line refuse the same things in the same words.
 */
import type { EnergySuffix, EnergyUnit, LengthSuffix } from '../../../shared/energy-units';
import {
  parseInteractionModel, parseTableCsv, resolvePair, type InteractionModel, type InteractionModelInput, type Pair, type PairForm, type ResolvedPair, type Truncation,
} from '../../../shared/interaction-model';

export interface PairDraft {
  a: string;
  b: string;
  form: PairForm;
  energy: EnergySuffix;
  length: LengthSuffix;
  /** LJ: ε, σ · Morse: D, α, r₀ · Buckingham: A, ρ, C. */
  p1: number | null;
  p2: number | null;
  p3: number | null;
  cutoff: number | null;
  truncation: Truncation;
  tail: boolean;
  /** Tabulated U(r): "r, U" lines, r in Å, U in tableUnit. */
  csv: string;
  tableUnit: EnergyUnit;
}

export interface ModelDraft {
  name: string;
  source: string;
  mixing: 'lorentz-berthelot' | 'none';
  pairs: PairDraft[];
}

export const FORM_LABELS: Record<PairForm, string> = {
  lj: 'Lennard-Jones 12-6', morse: 'Morse', buckingham: 'Buckingham exp-6', table: 'Tabulated U(r)', none: 'No interaction',
};

/** Parameter names and the kind of unit each takes, per form. */
export const PARAMETERS: Record<PairForm, { key: 'p1' | 'p2' | 'p3'; label: string; base: string; unit: 'energy' | 'length' | 'inverse' | 'c6' }[]> = {
  lj: [{ key: 'p1', label: 'ε (well depth)', base: 'epsilon', unit: 'energy' }, { key: 'p2', label: 'σ (zero crossing)', base: 'sigma', unit: 'length' }],
  morse: [
    { key: 'p1', label: 'D (well depth)', base: 'depth', unit: 'energy' }, { key: 'p2', label: 'α (stiffness)', base: 'alpha', unit: 'inverse' },
    { key: 'p3', label: 'r₀ (minimum)', base: 'r0', unit: 'length' },
  ],
  buckingham: [
    { key: 'p1', label: 'A (repulsion)', base: 'a', unit: 'energy' }, { key: 'p2', label: 'ρ (range)', base: 'rho', unit: 'length' },
    { key: 'p3', label: 'C (dispersion)', base: 'c', unit: 'c6' },
  ],
  table: [],
  none: [],
};

export function emptyPair(a = '', b = ''): PairDraft {
  return { a, b, form: 'lj', energy: 'EV', length: 'A', p1: null, p2: null, p3: null, cutoff: null, truncation: 'truncated', tail: false, csv: '', tableUnit: 'eV' };
}

/** Field name a parameter takes in the schema with the pair's units, e.g. sigmaNm, alphaPerA, cKJPerMolA6. */
export function fieldName(d: PairDraft, base: string, unit: 'energy' | 'length' | 'inverse' | 'c6'): string {
  switch (unit) {
    case 'energy': return `${base}${d.energy}`;
    case 'length': return `${base}${d.length}`;
    case 'inverse': return `${base}Per${d.length}`;
    case 'c6': return `${base}${d.energy}${d.length}6`;
  }
}

function pairInput(d: PairDraft): Record<string, unknown> {
  const species = [d.a.trim(), d.b.trim()];
  if (d.form === 'none') return { species, form: 'none' };
  const out: Record<string, unknown> = { species, form: d.form, truncation: d.truncation, tailCorrection: d.tail };
  if (d.cutoff !== null) out[`cutoff${d.length}`] = d.cutoff;
  for (const p of PARAMETERS[d.form]) {
    const v = d[p.key];
    if (v !== null) out[fieldName(d, p.base, p.unit)] = v;
  }
  if (d.form === 'table') {
    out['energyUnit'] = d.tableUnit;
    const table = parseTableCsv(d.csv);
    out['points'] = table.ok ? table.points : [];
  }
  return out;
}

export function toModelInput(m: ModelDraft): InteractionModelInput {
  const input: Record<string, unknown> = { pairs: m.pairs.map(pairInput), mixing: m.mixing };
  if (m.name.trim()) input['name'] = m.name.trim();
  if (m.source.trim()) input['source'] = m.source.trim();
  return input as InteractionModelInput;
}

/** Problems of the draft, each naming its pair and field; the table's own parse error is said in its words. */
export function draftIssues(m: ModelDraft): string[] {
  const tableIssues = m.pairs.flatMap((d, i) => {
    if (d.form !== 'table') return [];
    const t = parseTableCsv(d.csv);
    return t.ok ? [] : [`pairs[${i}] (${d.a}–${d.b}).points: ${t.issue}`];
  });
  const parsed = parseInteractionModel(toModelInput(m));
  const issues = parsed.ok ? [] : parsed.issues.filter((x) => !(tableIssues.length && /points/.test(x)));
  return [...tableIssues, ...issues];
}

/** The valid model, or null while the draft has problems. */
export function draftModel(m: ModelDraft): InteractionModel | null {
  const parsed = parseInteractionModel(toModelInput(m));
  return parsed.ok ? parsed.model : null;
}

/** One pair resolved for plotting, or null while it is incomplete. */
export function resolvedDraftPair(d: PairDraft): ResolvedPair | null {
  const parsed = parseInteractionModel({ pairs: [pairInput({ ...d, a: d.a || 'X', b: d.b || 'X' })] });
  return parsed.ok ? resolvePair(parsed.model.pairs[0] as Pair) : null;
}

const ENERGY_ORDER: EnergySuffix[] = ['EV', 'KJPerMol', 'KcalPerMol', 'K'];
const LENGTH_ORDER: LengthSuffix[] = ['A', 'Nm'];

/** A stored model back into drafts, keeping the units it was written in. */
export function fromModel(model: InteractionModel | InteractionModelInput | null | undefined): ModelDraft {
  if (!model) return { name: '', source: '', mixing: 'lorentz-berthelot', pairs: [emptyPair()] };
  const pairs = (model.pairs as unknown as Record<string, unknown>[]).map((p) => {
    const species = p['species'] as [string, string];
    const d = emptyPair(species[0], species[1]);
    d.form = p['form'] as PairForm;
    const has = (k: string) => typeof p[k] === 'number';
    d.length = LENGTH_ORDER.find((l) => has(`cutoff${l}`) || has(`sigma${l}`) || has(`r0${l}`) || has(`rho${l}`) || has(`alphaPer${l}`)) ?? 'A';
    d.energy = ENERGY_ORDER.find((e) => has(`epsilon${e}`) || has(`depth${e}`) || has(`a${e}`) || LENGTH_ORDER.some((l) => has(`c${e}${l}6`))) ?? 'EV';
    const cutoffKey = LENGTH_ORDER.map((l) => `cutoff${l}`).find(has);
    if (cutoffKey) {
      d.cutoff = p[cutoffKey] as number;
      if (!has(`cutoff${d.length}`)) d.cutoff = cutoffKey.endsWith('Nm') ? d.cutoff * 10 : d.cutoff / 10;
    }
    for (const param of PARAMETERS[d.form] ?? []) {
      const v = p[fieldName(d, param.base, param.unit)];
      if (typeof v === 'number') d[param.key] = v;
    }
    d.truncation = (p['truncation'] as Truncation | undefined) ?? 'truncated';
    d.tail = p['tailCorrection'] === true;
    if (d.form === 'table') {
      d.tableUnit = (p['energyUnit'] as EnergyUnit | undefined) ?? 'eV';
      d.csv = ((p['points'] as [number, number][] | undefined) ?? []).map(([r, u]) => `${r}, ${u}`).join('\n');
    }
    return d;
  });
  return { name: model.name ?? '', source: model.source ?? '', mixing: model.mixing ?? 'lorentz-berthelot', pairs };
}
