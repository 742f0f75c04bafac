/**
 * Names each member's phase (solid, liquid, vapour or unclear) from the
 * evidence its report holds, and keeps that evidence beside the name:
 * diffusion (D zero within error for a solid), the Lindemann ratio, the
 * shape of g(r), the density and the S(q) main peak (signatures as in
 * SCIENCE item 31, thresholds in phase-criteria.ts).
 *
 * Diffusion decides first; structure and density then tell liquid from
 * vapour, and any evidence that contradicts the first call makes it
 * "unclear" rather than a guess.
 */
import type { MotionRegime } from '../../../shared/report-summary.ts';
import type { EvidenceVerdict, MemberPhase, PhaseCriteria, PhaseEvidence, RdfShape } from '../../../shared/series-results.ts';
import { PHASE_CRITERIA } from './phase-criteria.ts';

export interface PhaseInput {
  /** Å²/ps. */
  d: number | null;
  dStdError: number | null;
  regime: MotionRegime | null;
  plateauA2?: number | null;
  lindemannRatio: number | null;
  rdf: RdfShape | null;
  densityGPerCm3: number | null;
  sqPeak: { qInvA: number; s: number } | null;
  /** Used only to name the reference member in the density evidence. */
  label: string;
}

const fmt = (v: number, digits = 3): string => (v === 0 ? '0' : Math.abs(v) >= 1e4 || Math.abs(v) < 1e-3 ? v.toExponential(digits - 1) : v.toPrecision(digits));

export function diffusionEvidence(m: PhaseInput, c: PhaseCriteria = PHASE_CRITERIA): PhaseEvidence {
  const base = { kind: 'diffusion' as const, unit: 'Å²/ps', value: m.d };
  if (m.regime === 'bounded') {
    const plateau = m.plateauA2 !== null && m.plateauA2 !== undefined ? ` at ${fmt(m.plateauA2)} Å²` : '';
    return { ...base, value: 0, verdict: 'solid', detail: `The MSD levels off${plateau}: no diffusion over the run.` };
  }
  if (m.d === null) {
    if (m.regime === 'too-short') return { ...base, verdict: 'missing', detail: 'The run is too short for a diffusive window.' };
    if (m.regime === 'subdiffusive') return { ...base, verdict: 'neutral', detail: 'The MSD grows sub-linearly: caged or glassy over this run.' };
    return { ...base, verdict: 'missing', detail: 'No MSD analysis in the report.' };
  }
  const error = m.dStdError !== null && m.dStdError > 0 ? m.dStdError : null;
  const stated = error !== null ? `D = ${fmt(m.d)} ± ${fmt(error, 2)} Å²/ps` : `D = ${fmt(m.d)} Å²/ps (no error)`;
  if (error !== null && m.d <= c.mobilitySigmas * error) {
    return { ...base, verdict: 'solid', detail: `${stated}: zero within ${c.mobilitySigmas} standard errors.` };
  }
  if (m.regime === 'subdiffusive') return { ...base, verdict: 'neutral', detail: `${stated}, but the MSD grows sub-linearly: caged or glassy.` };
  return { ...base, verdict: 'fluid', detail: `${stated}${error !== null ? `: more than ${c.mobilitySigmas} standard errors above zero` : ''}; atoms diffuse.` };
}

export function lindemannEvidence(m: PhaseInput, c: PhaseCriteria = PHASE_CRITERIA): PhaseEvidence {
  const base = { kind: 'lindemann' as const, unit: '1', value: m.lindemannRatio };
  if (m.lindemannRatio === null) return { ...base, verdict: 'missing', detail: 'No Lindemann analysis in the report.' };
  const v = m.lindemannRatio;
  if (v < c.lindemannSolidBelow) return { ...base, verdict: 'solid', detail: `Lindemann ratio ${fmt(v)}: below ${c.lindemannSolidBelow}, atoms vibrate about their sites.` };
  if (v > c.lindemannFluidAbove) return { ...base, verdict: 'fluid', detail: `Lindemann ratio ${fmt(v)}: above ${c.lindemannFluidAbove}, atoms have left their sites.` };
  return { ...base, verdict: 'neutral', detail: `Lindemann ratio ${fmt(v)}: between ${c.lindemannSolidBelow} and ${c.lindemannFluidAbove}, near the melting criterion.` };
}

export function structureEvidence(m: PhaseInput, c: PhaseCriteria = PHASE_CRITERIA): PhaseEvidence {
  const base = { kind: 'structure' as const, unit: '1' };
  const s = m.rdf;
  if (!s) return { ...base, value: null, verdict: 'missing', detail: 'No g(r) in the report, or g(r) has no first peak.' };
  if (!s.shells) return { ...base, value: null, verdict: 'vapour', detail: `g(r) ${s.pair} has no first-shell peak: no structure, gas-like.` };
  const peak = `first peak g = ${fmt(s.firstPeak.g)} at ${fmt(s.firstPeak.rA)} Å`;
  if (s.minToPeakRatio === null) return { ...base, value: null, verdict: 'neutral', detail: `g(r) ${s.pair}: ${peak}, no first minimum within r_max.` };
  const r = s.minToPeakRatio;
  const words = `g(r) ${s.pair}: ${peak}, g(min)/g(peak) = ${fmt(r)}`;
  if (r < c.rdfOrderedBelow) return { ...base, value: r, verdict: 'solid', detail: `${words}: deep first minimum, crystal-like order (below ${c.rdfOrderedBelow}).` };
  if (r > c.rdfGasAbove) return { ...base, value: r, verdict: 'vapour', detail: `${words}: structure lost beyond the first shell, gas-like (above ${c.rdfGasAbove}).` };
  return { ...base, value: r, verdict: 'liquid', detail: `${words}: liquid-like shells (between ${c.rdfOrderedBelow} and ${c.rdfGasAbove}).` };
}

export function structureFactorEvidence(m: PhaseInput, c: PhaseCriteria = PHASE_CRITERIA): PhaseEvidence {
  const base = { kind: 'structure-factor' as const, unit: '1', value: m.sqPeak?.s ?? null };
  if (!m.sqPeak) return { ...base, verdict: 'missing', detail: 'No S(q) in the report.' };
  const words = `S(q) main peak ${fmt(m.sqPeak.s)} at ${fmt(m.sqPeak.qInvA)} Å⁻¹`;
  if (m.sqPeak.s >= c.structureFactorFreezing) return { ...base, verdict: 'solid', detail: `${words}: at or above the ${c.structureFactorFreezing} freezing value.` };
  if (m.sqPeak.s < c.structureFactorGasBelow) return { ...base, verdict: 'vapour', detail: `${words}: weak structure, gas-like (below ${c.structureFactorGasBelow}).` };
  return { ...base, verdict: 'neutral', detail: `${words}: below the ${c.structureFactorFreezing} freezing value.` };
}

export interface DensityReference {
  densityGPerCm3: number;
  label: string;
}

/** Absolute packing n·r₁³ where g(r) gives it, and density relative to the series' densest condensed member. */
export function densityEvidence(m: PhaseInput, reference: DensityReference | null, c: PhaseCriteria = PHASE_CRITERIA): PhaseEvidence {
  const base = { kind: 'density' as const, unit: 'g/cm³', value: m.densityGPerCm3 };
  const packing = m.rdf?.packing ?? null;
  const parts: string[] = [];
  const calls: EvidenceVerdict[] = [];
  if (m.densityGPerCm3 !== null) {
    parts.push(`ρ = ${fmt(m.densityGPerCm3)} g/cm³`);
    if (reference && reference.densityGPerCm3 > 0) {
      const fraction = m.densityGPerCm3 / reference.densityGPerCm3;
      parts.push(`${fmt(fraction, 2)} of ${reference.label}`);
      calls.push(fraction < c.densityDiluteFraction ? 'vapour' : fraction >= c.densityCondensedFraction ? 'condensed' : 'neutral');
    }
  }
  if (packing !== null) {
    parts.push(`packing n·r₁³ = ${fmt(packing, 2)}`);
    calls.push(packing < c.packingDiluteBelow ? 'vapour' : packing >= c.packingCondensedAbove ? 'condensed' : 'neutral');
  }
  if (parts.length === 0) return { ...base, verdict: 'missing', detail: 'No density: the run has no periodic cell, or no temperature analysis.' };
  const decided = calls.filter((v) => v !== 'neutral');
  const verdict: EvidenceVerdict = decided.length === 0 ? 'neutral' : decided.every((v) => v === decided[0]) ? decided[0] : 'neutral';
  const meaning = verdict === 'vapour' ? 'dilute, vapour-like' : verdict === 'condensed' ? 'condensed (solid or liquid)' : calls.length ? 'in between or conflicting' : 'nothing to compare with';
  return { ...base, verdict, detail: `${parts.join('; ')}: ${meaning}.` };
}

/** Evidence that a member is condensed without looking at its density: it does not diffuse, or it is densely packed. */
export function isCondensedReference(m: PhaseInput, c: PhaseCriteria = PHASE_CRITERIA): boolean {
  return diffusionEvidence(m, c).verdict === 'solid' || (m.rdf?.packing ?? 0) >= c.packingCondensedAbove;
}

export function namePhase(m: PhaseInput, reference: DensityReference | null, c: PhaseCriteria = PHASE_CRITERIA): MemberPhase {
  const diffusion = diffusionEvidence(m, c);
  const lindemann = lindemannEvidence(m, c);
  const structure = structureEvidence(m, c);
  const density = densityEvidence(m, reference, c);
  const sq = structureFactorEvidence(m, c);
  const evidence = [diffusion, lindemann, structure, density, sq];
  const decided = (phase: MemberPhase['phase'], reason: string): MemberPhase => ({ phase, reason, evidence });

  const disorder = structure.verdict === 'liquid' || structure.verdict === 'vapour' || lindemann.verdict === 'fluid';
  const order = structure.verdict === 'solid' || lindemann.verdict === 'solid' || sq.verdict === 'solid';

  if (diffusion.verdict === 'solid') {
    if (disorder) return decided('unclear', 'No diffusion, yet g(r) or the Lindemann ratio shows disorder: a glass, or a run too short to see diffusion.');
    return decided('solid', `No diffusion within error${order ? ', and the structure is ordered' : ''}.`);
  }
  if (diffusion.verdict === 'fluid') {
    if (structure.verdict === 'solid' || lindemann.verdict === 'solid') {
      return decided('unclear', 'Atoms diffuse, yet g(r) or the Lindemann ratio shows crystal-like order: partly melted, or a solid with mobile defects.');
    }
    if (density.verdict === 'vapour') return decided('vapour', 'Atoms diffuse and the density is dilute.');
    if (density.verdict === 'condensed') {
      return decided('liquid', structure.verdict === 'vapour' ? 'Atoms diffuse at condensed density, though g(r) shows little shell structure.' : 'Atoms diffuse at condensed density.');
    }
    if (structure.verdict === 'vapour' || sq.verdict === 'vapour') return decided('vapour', 'Atoms diffuse and the structure is gas-like.');
    if (structure.verdict === 'liquid') return decided('liquid', 'Atoms diffuse and g(r) has liquid-like shells.');
    return decided('unclear', 'Atoms diffuse, but neither density nor g(r) tells liquid from vapour.');
  }
  // Without a diffusion call, the structural evidence must agree on its own.
  const solidVotes = [structure, lindemann, sq].filter((e) => e.verdict === 'solid').length;
  if (solidVotes >= 2 && !disorder) return decided('solid', 'No diffusion call, but g(r), the Lindemann ratio and S(q) agree on crystal-like order.');
  if (density.verdict === 'vapour' && !order) return decided('vapour', 'No diffusion call, but the density is dilute and the structure is not ordered.');
  if (structure.verdict === 'liquid' && lindemann.verdict === 'fluid') return decided('liquid', 'No diffusion call, but g(r) and the Lindemann ratio agree on a liquid.');
  return decided('unclear', 'Without a clear diffusion signal the other evidence is not decisive.');
}

/**
 * Names every member: first finds the densest member known to be condensed
 * without using density, then judges each density against it.
 */
export function namePhases(members: readonly PhaseInput[], c: PhaseCriteria = PHASE_CRITERIA): MemberPhase[] {
  let reference: DensityReference | null = null;
  for (const m of members) {
    if (m.densityGPerCm3 === null || !isCondensedReference(m, c)) continue;
    if (!reference || m.densityGPerCm3 > reference.densityGPerCm3) reference = { densityGPerCm3: m.densityGPerCm3, label: m.label };
  }
  return members.map((m) => namePhase(m, reference, c));
}
