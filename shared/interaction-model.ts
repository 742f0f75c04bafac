/**
 * The interaction model of a run: one pair potential per species pair, with
 * units in the field names (epsilonEV, sigmaA, cutoffNm…), a cut-off, a
 * truncation convention and optional analytic tail corrections. One schema
 * for the browser's editor, the API, the database and `--potential` on the
 * command line, so all of them accept and refuse exactly the same input.
 *
 * Forms (r in Å, energies in eV after conversion):
 *   lj          U = 4ε[(σ/r)¹² − (σ/r)⁶]
 *   morse       U = D[e^{−2α(r−r₀)} − 2e^{−α(r−r₀)}]
 *   buckingham  U = A·e^{−r/ρ} − C/r⁶
 *   table       U(r) from (r, U) points, natural cubic spline; force from its derivative
 *   none        no interaction (stated, not assumed)
 * Unlike LJ pairs that are not listed take Lorentz–Berthelot mixing,
 * σ_ab = (σ_a + σ_b)/2, ε_ab = √(ε_a·ε_b), when `mixing` allows it.
 */
import { z } from 'zod';
import {
  ENERGY_SUFFIXES, ENERGY_SUFFIX_LIST, ENERGY_UNIT_LIST, ENERGY_UNITS, LENGTH_SUFFIXES, LENGTH_SUFFIX_LIST,
  type EnergySuffix, type EnergyUnit, type LengthSuffix,
} from './energy-units.ts';

export const PAIR_FORMS = ['lj', 'morse', 'buckingham', 'table', 'none'] as const;
export type PairForm = (typeof PAIR_FORMS)[number];
/** truncated: U(r) inside rc; shifted: U(r) − U(rc); force-shifted: U(r) − U(rc) − (r − rc)·U′(rc), smooth force at rc. */
export const TRUNCATIONS = ['truncated', 'shifted', 'force-shifted'] as const;
export type Truncation = (typeof TRUNCATIONS)[number];
export const MIXING_RULES = ['lorentz-berthelot', 'none'] as const;

/** Longest cut-off accepted, Å: beyond it a pair sum over periodic images gets needlessly slow. */
export const MAX_CUTOFF_A = 60;

type Fields<B extends string, S extends string> = { [K in `${B}${S}`]: z.ZodOptional<z.ZodNumber> };

function unitFields<B extends string, S extends string>(base: B, suffixes: readonly S[], value: z.ZodNumber): Fields<B, S> {
  return Object.fromEntries(suffixes.map((s) => [`${base}${s}`, value.optional()])) as Fields<B, S>;
}

/** C of exp-6 carries energy × length⁶: cEVA6, cKJPerMolNm6, … */
const C6_SUFFIXES = ENERGY_SUFFIX_LIST.flatMap((e) => LENGTH_SUFFIX_LIST.map((l) => `${e}${l}6` as `${EnergySuffix}${LengthSuffix}6`));

const positive = z.number().positive('must be above 0');
const nonNegative = z.number().nonnegative('must not be negative');
const speciesLabel = z.string().trim().min(1, 'must not be empty').max(16, 'at most 16 characters')
  .regex(/^[A-Za-z][A-Za-z0-9_+-]*$/, 'must start with a letter and hold only letters, digits, _ + -');

const common = {
  species: z.tuple([speciesLabel, speciesLabel]),
  ...unitFields('cutoff', LENGTH_SUFFIX_LIST, positive),
  truncation: z.enum(TRUNCATIONS).default('truncated'),
  tailCorrection: z.boolean().default(false),
};

const ljPair = z.strictObject({
  form: z.literal('lj'),
  ...common,
  ...unitFields('epsilon', ENERGY_SUFFIX_LIST, nonNegative),
  ...unitFields('sigma', LENGTH_SUFFIX_LIST, positive),
});

const morsePair = z.strictObject({
  form: z.literal('morse'),
  ...common,
  ...unitFields('depth', ENERGY_SUFFIX_LIST, nonNegative),
  alphaPerA: positive.optional(),
  alphaPerNm: positive.optional(),
  ...unitFields('r0', LENGTH_SUFFIX_LIST, positive),
});

const buckinghamPair = z.strictObject({
  form: z.literal('buckingham'),
  ...common,
  ...unitFields('a', ENERGY_SUFFIX_LIST, nonNegative),
  ...unitFields('rho', LENGTH_SUFFIX_LIST, positive),
  ...unitFields('c', C6_SUFFIXES, nonNegative),
});

const tablePair = z.strictObject({
  form: z.literal('table'),
  ...common,
  /** Unit of U in `points`; r is in Å. */
  energyUnit: z.enum(ENERGY_UNIT_LIST),
  /** (r in Å, U) pairs, r strictly increasing. */
  points: z.array(z.tuple([z.number().positive('r must be above 0'), z.number()])).min(4, 'needs at least 4 points').max(20_000, 'at most 20 000 points'),
});

const nonePair = z.strictObject({ form: z.literal('none'), species: common.species });

export const pairSchema = z.discriminatedUnion('form', [ljPair, morsePair, buckinghamPair, tablePair, nonePair], {
  error: (issue) => (issue.code === 'invalid_union' ? `form must be one of ${PAIR_FORMS.join(', ')}` : undefined),
}).superRefine((pair, ctx) => {
  if (pair.form === 'none') return;
  const need = (base: string, suffixes: readonly string[], what: string): void => {
    const given = suffixes.filter((s) => (pair as Record<string, unknown>)[`${base}${s}`] !== undefined);
    if (given.length !== 1) {
      ctx.addIssue({
        code: 'custom', path: [given.length > 1 ? `${base}${given[1]}` : base],
        message: `give ${what} as exactly one of ${suffixes.map((s) => base + s).join(', ')}${given.length > 1 ? ` (found ${given.map((s) => base + s).join(' and ')})` : ''}`,
      });
    }
  };
  need('cutoff', LENGTH_SUFFIX_LIST, 'the cut-off');
  if (pair.form === 'lj') {
    need('epsilon', ENERGY_SUFFIX_LIST, 'ε');
    need('sigma', LENGTH_SUFFIX_LIST, 'σ');
  } else if (pair.form === 'morse') {
    need('depth', ENERGY_SUFFIX_LIST, 'the well depth D');
    need('alpha', ['PerA', 'PerNm'], 'α');
    need('r0', LENGTH_SUFFIX_LIST, 'r₀');
  } else if (pair.form === 'buckingham') {
    need('a', ENERGY_SUFFIX_LIST, 'A');
    need('rho', LENGTH_SUFFIX_LIST, 'ρ');
    need('c', C6_SUFFIXES, 'C');
  } else {
    for (let k = 1; k < pair.points.length; k++) {
      if (!(pair.points[k][0] > pair.points[k - 1][0])) {
        ctx.addIssue({ code: 'custom', path: ['points', k], message: `r must increase from point to point (point ${k + 1}: r = ${pair.points[k][0]} after ${pair.points[k - 1][0]})` });
        break;
      }
    }
    const cut = cutoffOf(pair);
    const last = pair.points.length ? pair.points[pair.points.length - 1][0] : undefined;
    if (cut !== undefined && last !== undefined && cut > last + 1e-9) {
      ctx.addIssue({ code: 'custom', path: ['cutoffA'], message: `the cut-off (${cut} Å) lies beyond the table's last point (${last} Å)` });
    }
  }
  if (pair.tailCorrection && pair.form === 'table') {
    ctx.addIssue({ code: 'custom', path: ['tailCorrection'], message: 'a tabulated potential has no analytic tail: it is taken as zero beyond its cut-off' });
  }
  if (pair.tailCorrection && pair.truncation !== 'truncated') {
    ctx.addIssue({ code: 'custom', path: ['tailCorrection'], message: `tail corrections belong to a truncated (unshifted) potential, not a ${pair.truncation} one; choose one or the other` });
  }
  const cut = cutoffOf(pair);
  if (cut !== undefined && cut > MAX_CUTOFF_A) {
    ctx.addIssue({ code: 'custom', path: ['cutoffA'], message: `the cut-off must be at most ${MAX_CUTOFF_A} Å (got ${cut} Å)` });
  }
});

export const interactionModelSchema = z.strictObject({
  /** A name people recognise, e.g. "Argon, LJ 12-6". */
  name: z.string().trim().max(120, 'at most 120 characters').optional(),
  /** Where the parameters come from (citation), when known. */
  source: z.string().trim().max(1000, 'at most 1000 characters').optional(),
  pairs: z.array(pairSchema).min(1, 'give at least one pair').max(200, 'at most 200 pairs'),
  mixing: z.enum(MIXING_RULES).default('lorentz-berthelot'),
}).superRefine((model, ctx) => {
  const seen = new Map<string, number>();
  model.pairs.forEach((p, i) => {
    const key = pairKey(p.species[0], p.species[1]);
    const first = seen.get(key);
    if (first !== undefined) {
      ctx.addIssue({ code: 'custom', path: ['pairs', i, 'species'], message: `the pair ${p.species.join('–')} is already given as pairs[${first}]` });
    } else seen.set(key, i);
  });
});

export type InteractionModel = z.infer<typeof interactionModelSchema>;
export type InteractionModelInput = z.input<typeof interactionModelSchema>;
export type PairInput = z.input<typeof pairSchema>;
export type Pair = z.infer<typeof pairSchema>;

/** Unordered key of a species pair. */
export function pairKey(a: string, b: string): string {
  return a <= b ? `${a}|${b}` : `${b}|${a}`;
}

function valueOf(pair: Record<string, unknown>, base: string, factors: Record<string, number>): number | undefined {
  for (const [suffix, factor] of Object.entries(factors)) {
    const v = pair[`${base}${suffix}`];
    if (typeof v === 'number') return v * factor;
  }
  return undefined;
}

function cutoffOf(pair: Record<string, unknown>): number | undefined {
  return valueOf(pair, 'cutoff', LENGTH_SUFFIXES);
}

const C6_FACTORS: Record<string, number> = Object.fromEntries(
  ENERGY_SUFFIX_LIST.flatMap((e) => LENGTH_SUFFIX_LIST.map((l) => [`${e}${l}6`, ENERGY_SUFFIXES[e] * LENGTH_SUFFIXES[l] ** 6])),
);

interface ResolvedCommon {
  species: [string, string];
  cutoffA: number;
  truncation: Truncation;
  tailCorrection: boolean;
  /** 'given' in the model, or 'mixed' by Lorentz–Berthelot from the two like pairs. */
  origin: 'given' | 'mixed';
}

/** A pair in the engine's working units: energies in eV, lengths in Å. */
export type ResolvedPair = ResolvedCommon & (
  | { form: 'lj'; epsilonEV: number; sigmaA: number }
  | { form: 'morse'; depthEV: number; alphaPerA: number; r0A: number }
  | { form: 'buckingham'; aEV: number; rhoA: number; cEVA6: number }
  | { form: 'table'; rA: number[]; uEV: number[] }
  | { form: 'none' }
);

/** One validated pair in eV and Å. */
export function resolvePair(pair: Pair, origin: 'given' | 'mixed' = 'given'): ResolvedPair {
  const p = pair as unknown as Record<string, unknown>;
  const species: [string, string] = [pair.species[0], pair.species[1]];
  if (pair.form === 'none') return { form: 'none', species, cutoffA: 0, truncation: 'truncated', tailCorrection: false, origin };
  const base = { species, cutoffA: cutoffOf(p)!, truncation: pair.truncation, tailCorrection: pair.tailCorrection, origin };
  switch (pair.form) {
    case 'lj':
      return { ...base, form: 'lj', epsilonEV: valueOf(p, 'epsilon', ENERGY_SUFFIXES)!, sigmaA: valueOf(p, 'sigma', LENGTH_SUFFIXES)! };
    case 'morse':
      return { ...base, form: 'morse', depthEV: valueOf(p, 'depth', ENERGY_SUFFIXES)!, alphaPerA: valueOf(p, 'alpha', { PerA: 1, PerNm: 0.1 })!, r0A: valueOf(p, 'r0', LENGTH_SUFFIXES)! };
    case 'buckingham':
      return { ...base, form: 'buckingham', aEV: valueOf(p, 'a', ENERGY_SUFFIXES)!, rhoA: valueOf(p, 'rho', LENGTH_SUFFIXES)!, cEVA6: valueOf(p, 'c', C6_FACTORS)! };
    case 'table': {
      const f = ENERGY_UNITS[pair.energyUnit as EnergyUnit];
      return { ...base, form: 'table', rA: pair.points.map((q) => q[0]), uEV: pair.points.map((q) => q[1] * f) };
    }
  }
}

export class MissingPairError extends Error {}

/**
 * Every unordered pair of the species present, resolved: given pairs as
 * written, unlike LJ pairs by Lorentz–Berthelot when both like pairs are LJ
 * and the model allows mixing. The cut-off of a mixed pair is the larger of
 * the two like cut-offs; it takes the more shifted convention of the two
 * (force-shifted over shifted over truncated), and is tail-corrected if both are.
 */
export function resolvePairsFor(model: InteractionModel, species: readonly string[]): ResolvedPair[] {
  const given = new Map(model.pairs.map((p) => [pairKey(p.species[0], p.species[1]), p]));
  const kinds = [...new Set(species)].sort();
  const out: ResolvedPair[] = [];
  const missing: string[] = [];
  for (let a = 0; a < kinds.length; a++) {
    for (let b = a; b < kinds.length; b++) {
      const p = given.get(pairKey(kinds[a], kinds[b]));
      if (p) {
        out.push({ ...resolvePair(p), species: [kinds[a], kinds[b]] });
        continue;
      }
      const aa = given.get(pairKey(kinds[a], kinds[a]));
      const bb = given.get(pairKey(kinds[b], kinds[b]));
      if (a !== b && model.mixing === 'lorentz-berthelot' && aa?.form === 'lj' && bb?.form === 'lj') {
        const ra = resolvePair(aa), rb = resolvePair(bb);
        if (ra.form !== 'lj' || rb.form !== 'lj') continue;
        out.push({
          form: 'lj', species: [kinds[a], kinds[b]], origin: 'mixed',
          epsilonEV: Math.sqrt(ra.epsilonEV * rb.epsilonEV), sigmaA: 0.5 * (ra.sigmaA + rb.sigmaA),
          cutoffA: Math.max(ra.cutoffA, rb.cutoffA),
          truncation: ra.truncation === 'force-shifted' || rb.truncation === 'force-shifted' ? 'force-shifted' : ra.truncation === 'shifted' || rb.truncation === 'shifted' ? 'shifted' : 'truncated',
          tailCorrection: ra.tailCorrection && rb.tailCorrection,
        });
      } else missing.push(`${kinds[a]}–${kinds[b]}`);
    }
  }
  if (missing.length > 0) {
    throw new MissingPairError(
      `the interaction model gives no potential for ${missing.join(', ')}: add ${missing.length > 1 ? 'these pairs' : 'this pair'} ` +
      `(form "none" for no interaction)${model.mixing === 'lorentz-berthelot' ? ', or give both like pairs as LJ so Lorentz–Berthelot mixing applies' : ''}`,
    );
  }
  return out;
}

/** Validation problems as "where: what" lines, e.g. "pairs[0] (Ar–Ar).sigmaA: must be above 0". */
export function describeModelIssues(error: z.ZodError, input?: unknown): string[] {
  const pairs = (input as { pairs?: { species?: unknown }[] } | undefined)?.pairs;
  return error.issues.map((issue) => {
    const where = issue.path.map((p, i) => {
      if (typeof p === 'number') {
        const label = i === 1 && issue.path[0] === 'pairs' && Array.isArray(pairs?.[p]?.species) ? ` (${(pairs[p].species as unknown[]).join('–')})` : '';
        return `[${p}]${label}`;
      }
      return i === 0 ? String(p) : `.${String(p)}`;
    }).join('');
    if (issue.code === 'unrecognized_keys') {
      const keys = issue.keys.map((k) => `${k}${unitHint(k)}`).join('; ');
      return `${where || 'model'}: unknown field ${keys}`;
    }
    return `${where || 'model'}: ${issue.message}`;
  });
}

function unitHint(key: string): string {
  const lengths = ['sigma', 'cutoff', 'r0', 'rho'];
  const energies = ['epsilon', 'depth', 'a'];
  if (lengths.includes(key)) return ` (lengths carry their unit: ${LENGTH_SUFFIX_LIST.map((s) => key + s).join(' or ')})`;
  if (energies.includes(key)) return ` (energies carry their unit: ${ENERGY_SUFFIX_LIST.map((s) => key + s).join(', ')})`;
  if (key === 'alpha') return ' (use alphaPerA or alphaPerNm)';
  if (key === 'c') return ' (use cEVA6, cKJPerMolNm6, …)';
  return '';
}

/** Parses and validates; returns the model or the problems, each naming its field. */
export function parseInteractionModel(input: unknown): { ok: true; model: InteractionModel } | { ok: false; issues: string[] } {
  const r = interactionModelSchema.safeParse(input);
  return r.success ? { ok: true, model: r.data } : { ok: false, issues: describeModelIssues(r.error, input) };
}

/** Reads "r,U" lines (r in Å) of a CSV table; '#' lines and one header line are skipped. */
export function parseTableCsv(text: string): { ok: true; points: [number, number][] } | { ok: false; issue: string } {
  const points: [number, number][] = [];
  const lines = text.split(/\r?\n/);
  let headerSeen = false;
  for (let i = 0; i < lines.length; i++) {
    const line = lines[i].trim();
    if (line === '' || line.startsWith('#')) continue;
    const cells = line.split(/[,;\t ]+/).filter(Boolean);
    const nums = cells.map(Number);
    if (cells.length < 2 || nums.slice(0, 2).some((n) => !Number.isFinite(n))) {
      if (!headerSeen && points.length === 0) {
        headerSeen = true;
        continue;
      }
      return { ok: false, issue: `line ${i + 1}: expected two numbers "r, U", got "${line.slice(0, 60)}"` };
    }
    points.push([nums[0], nums[1]]);
  }
  if (points.length < 4) return { ok: false, issue: `the table needs at least 4 rows of "r, U", found ${points.length}` };
  return { ok: true, points };
}
