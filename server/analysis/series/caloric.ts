/**
 * The caloric curve E(T) across members, the latent heat from its jump at
 * melting, and the heat capacity three ways: the slope dE/dT between
 * neighbouring members, each member's own energy fluctuations, and the
 * harmonic value from its VDOS (SCIENCE items 16, 28 and 31).
 *
 * Latent heat: straight lines through the solid and the liquid members'
 * E(T), compared at the middle of the melting bracket (common practice for
 * reading a jump off a caloric curve). A phase with one member borrows the
 * other phase's slope; with one member on each side only the raw jump,
 * sensible heat included, can be given, and the method says so.
 */
import type {
  Branch, CaloricCurve, CaloricPoint, HeatCapacityPoint, LatentHeat, MemberEnergy, PhaseName, TransitionBracket,
} from '../../../shared/series-results.ts';
import { AVOGADRO_PER_MOL, BOLTZMANN_J_PER_K, ELEMENTARY_CHARGE_C, GAS_CONSTANT_J_PER_MOL_K } from '../constants.ts';
import { fitWeightedLine, lineAt, type LineFit } from './weighted-line.ts';

/** Boltzmann constant in eV/K. */
const KB_EV = BOLTZMANN_J_PER_K / ELEMENTARY_CHARGE_C;
/** kJ/mol per eV per particle. */
const KJ_PER_MOL_PER_EV = (ELEMENTARY_CHARGE_C * AVOGADRO_PER_MOL) / 1e3;

export interface CaloricMember {
  trajectoryId: number;
  label: string;
  temperatureK: number | null;
  /** Standard error of a measured temperature; its spread moves E(T) points sideways. */
  temperatureStdError: number | null;
  energy: MemberEnergy | null;
  phase: PhaseName;
  branch: Branch | null;
  excluded: boolean;
  cvFluctuationPerAtomKB: { value: number; stdError: number | null } | null;
  cvHarmonicPerAtomKB: number | null;
}

const NOTES: Record<CaloricCurve['energyKind'], string> = {
  total: 'Total energy per atom (potential + kinetic) from each run\'s energy analysis.',
  kinetic: 'Kinetic energy per atom only: these runs have no potential energies, so the curve follows (degrees of freedom / 2N)·k_B·T by construction '
    + 'and cannot show a latent heat. Give the runs an interaction model, or energies in the file, for the full caloric curve.',
  mixed: 'Some members have total energies and others only kinetic: the curve mixes the two and no slope or jump is read from it.',
  none: 'No member has energies.',
};

export function caloricCurve(members: readonly CaloricMember[], melting: TransitionBracket | undefined): CaloricCurve {
  const points: CaloricPoint[] = members
    .filter((m): m is CaloricMember & { temperatureK: number; energy: MemberEnergy } => m.temperatureK !== null && m.energy !== null)
    .map((m) => ({ trajectoryId: m.trajectoryId, temperatureK: m.temperatureK, energyPerAtomEV: m.energy.eV, stdError: m.energy.stdError, phase: m.phase, branch: m.branch }))
    .sort((a, b) => a.temperatureK - b.temperatureK);
  const kinds = new Set(members.flatMap((m) => (m.energy ? [m.energy.kind] : [])));
  const energyKind: CaloricCurve['energyKind'] = kinds.size === 0 ? 'none' : kinds.size > 1 ? 'mixed' : kinds.has('total') ? 'total' : 'kinetic';
  const { latentHeat, note } = energyKind === 'total'
    ? latentHeatAt(members, melting)
    : { latentHeat: null, note: energyKind === 'kinetic' ? 'A latent heat needs total energies; kinetic energy is continuous through melting.' : 'A latent heat needs total energies for every member.' };
  return { energyKind, note: NOTES[energyKind], points, latentHeat, latentHeatNote: note };
}

interface Placed { temperatureK: number; temperatureStdError: number | null; eV: number; stdError: number | null }

function phasePoints(members: readonly CaloricMember[], phase: PhaseName): Placed[] {
  return members
    .filter((m) => !m.excluded && m.phase === phase && m.temperatureK !== null && m.energy?.kind === 'total')
    .map((m) => ({ temperatureK: m.temperatureK as number, temperatureStdError: m.temperatureStdError, eV: (m.energy as MemberEnergy).eV, stdError: (m.energy as MemberEnergy).stdError }));
}

function lineThrough(points: Placed[]): LineFit | null {
  if (points.length < 2 || new Set(points.map((p) => p.temperatureK)).size < 2) return null;
  return fitWeightedLine(points.map((p) => p.temperatureK), points.map((p) => p.eV), points.map((p) => p.stdError), points.map((p) => p.temperatureStdError));
}

/** E at T from a phase's own line, or from its one point with the other phase's slope. */
function energyAt(points: Placed[], own: LineFit | null, borrowed: LineFit | null, t: number): { value: number; stdError: number | null } | null {
  if (own) return lineAt(own, t);
  if (points.length !== 1 || !borrowed) return null;
  const p = points[0];
  const dt = t - p.temperatureK;
  const slopeVar = borrowed.covariance?.bb ?? null;
  const sideways = borrowed.slope * (p.temperatureStdError ?? 0);
  const error = p.stdError !== null && slopeVar !== null ? Math.sqrt(p.stdError ** 2 + sideways ** 2 + dt * dt * slopeVar) : null;
  return { value: p.eV + borrowed.slope * dt, stdError: error };
}

function latentHeatAt(members: readonly CaloricMember[], melting: TransitionBracket | undefined): { latentHeat: LatentHeat | null; note: string } {
  if (!melting?.below || !melting.above) return { latentHeat: null, note: 'No melting bracket, so no jump to read a latent heat from.' };
  if (melting.overlap) return { latentHeat: null, note: 'The solid and liquid members overlap in temperature; the jump is not read from overlapping branches.' };
  const solid = phasePoints(members, 'solid'), liquid = phasePoints(members, 'liquid');
  if (solid.length === 0 || liquid.length === 0) return { latentHeat: null, note: 'The bracketing members are excluded from fits or lack total energies.' };
  const atK = 0.5 * (melting.below.temperatureK + melting.above.temperatureK);
  const solidLine = lineThrough(solid), liquidLine = lineThrough(liquid);
  let method: string;
  let jump: { value: number; stdError: number | null };
  const es = energyAt(solid, solidLine, liquidLine, atK), el = energyAt(liquid, liquidLine, solidLine, atK);
  if (es && el) {
    jump = { value: el.value - es.value, stdError: es.stdError !== null && el.stdError !== null ? Math.hypot(es.stdError, el.stdError) : null };
    method = solidLine && liquidLine
      ? `Lines through the ${solid.length} solid and ${liquid.length} liquid members, compared at ${atK.toFixed(1)} K.`
      : `A line through one phase's members and the other's single member with the same slope, compared at ${atK.toFixed(1)} K.`;
  } else {
    // One member on each side: the raw jump, which also holds the sensible heat across the bracket.
    const s = solid.reduce((a, b) => (b.temperatureK > a.temperatureK ? b : a));
    const l = liquid.reduce((a, b) => (b.temperatureK < a.temperatureK ? b : a));
    jump = { value: l.eV - s.eV, stdError: s.stdError !== null && l.stdError !== null ? Math.hypot(s.stdError, l.stdError) : null };
    method = `Raw jump between the bracketing members (${s.temperatureK.toFixed(1)} K and ${l.temperatureK.toFixed(1)} K); it includes the sensible heat across the bracket, an upper bound.`;
  }
  return {
    latentHeat: {
      eVPerAtom: jump.value, kJPerMol: jump.value * KJ_PER_MOL_PER_EV,
      stdErrorEVPerAtom: jump.stdError, stdErrorKJPerMol: jump.stdError === null ? null : jump.stdError * KJ_PER_MOL_PER_EV,
      atK, method,
    },
    note: 'Latent energy at constant volume (ΔU) for NVT or NVE runs; an NPT series gives the enthalpy only with the PV term added.',
  };
}

/** dE/dT between neighbouring members of the same branch, each member's fluctuation value, and its harmonic VDOS value. */
export function heatCapacityPoints(members: readonly CaloricMember[], energyKind: CaloricCurve['energyKind']): HeatCapacityPoint[] {
  const out: HeatCapacityPoint[] = [];
  const toJPerMolK = (kb: number): number => kb * GAS_CONSTANT_J_PER_MOL_K;
  if (energyKind === 'total' || energyKind === 'kinetic') {
    const groups = new Map<string, CaloricMember[]>();
    for (const m of members) {
      if (m.excluded || m.temperatureK === null || !m.energy) continue;
      const key = m.branch ?? 'none';
      groups.set(key, [...(groups.get(key) ?? []), m]);
    }
    for (const group of groups.values()) {
      const sorted = group.sort((a, b) => (a.temperatureK as number) - (b.temperatureK as number));
      for (let i = 0; i + 1 < sorted.length; i++) {
        const a = sorted[i], b = sorted[i + 1];
        const dt = (b.temperatureK as number) - (a.temperatureK as number);
        if (!(dt > 0)) continue;
        const ea = a.energy as MemberEnergy, eb = b.energy as MemberEnergy;
        const perAtomKB = (eb.eV - ea.eV) / dt / KB_EV;
        // Both the energies and the (measured) temperatures carry errors: σ²(ΔE/ΔT) = (σ²_ΔE + (ΔE/ΔT)²·σ²_ΔT)/ΔT².
        const stdErrorKB = ea.stdError !== null && eb.stdError !== null
          ? Math.sqrt(ea.stdError ** 2 + eb.stdError ** 2 + ((eb.eV - ea.eV) / dt) ** 2 * ((a.temperatureStdError ?? 0) ** 2 + (b.temperatureStdError ?? 0) ** 2)) / dt / KB_EV
          : null;
        out.push({
          temperatureK: 0.5 * ((a.temperatureK as number) + (b.temperatureK as number)), perAtomKB, stdErrorKB, jPerMolK: toJPerMolK(perAtomKB),
          source: 'slope', trajectoryIds: [a.trajectoryId, b.trajectoryId], acrossTransition: a.phase !== b.phase, energyKind,
        });
      }
    }
  }
  for (const m of members) {
    if (m.temperatureK === null) continue;
    if (m.cvFluctuationPerAtomKB) {
      out.push({
        temperatureK: m.temperatureK, perAtomKB: m.cvFluctuationPerAtomKB.value, stdErrorKB: m.cvFluctuationPerAtomKB.stdError,
        jPerMolK: toJPerMolK(m.cvFluctuationPerAtomKB.value), source: 'fluctuation', trajectoryIds: [m.trajectoryId], acrossTransition: false, energyKind: 'total',
      });
    }
    if (m.cvHarmonicPerAtomKB !== null) {
      out.push({
        temperatureK: m.temperatureK, perAtomKB: m.cvHarmonicPerAtomKB, stdErrorKB: null, jPerMolK: toJPerMolK(m.cvHarmonicPerAtomKB),
        source: 'harmonic-vdos', trajectoryIds: [m.trajectoryId], acrossTransition: false, energyKind: null,
      });
    }
  }
  return out.sort((a, b) => a.temperatureK - b.temperatureK);
}
