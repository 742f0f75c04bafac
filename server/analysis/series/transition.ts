/**
 * Melting and boiling brackets from the members' phases: the highest member
 * still in the low-temperature phase and the lowest already in the high-
 * temperature one, for the whole series and for each heating or cooling
 * branch. Heating overshoots a transition and cooling undershoots it
 * (SCIENCE item 31), so where both branches exist the true point lies
 * between the highest solid on cooling and the lowest liquid on heating.
 */
import type { Branch, PhaseName, TransitionBracket, TransitionResult } from '../../../shared/series-results.ts';

export interface TransitionMember {
  trajectoryId: number;
  label: string;
  temperatureK: number | null;
  phase: PhaseName;
  branch: Branch | null;
}

export const MELTING_CAUTION =
  'Heating a defect-free crystal overshoots the melting point (superheating) and cooling a liquid undershoots it (supercooling), ' +
  'so a bracket from single-phase runs is not the thermodynamic melting temperature; a two-phase (coexistence) run brackets it far better. ' +
  'The result also depends on the potential, the system size and the run length.';

export const BOILING_CAUTION =
  'Vaporization seen in a series of runs depends on the box: at fixed volume a run below the critical temperature can hold liquid and vapour at once, ' +
  'and a small box delays or hides the change. Density collapse, loss of structure and a jump in D mark it; a coexistence run, or a constant-pressure ' +
  'series at the pressure of interest, is needed for a boiling point.';

const K = (t: number): string => `${Number(t.toPrecision(4))} K`;

function bracket(members: readonly TransitionMember[], branch: TransitionBracket['branch'], low: PhaseName, high: PhaseName): TransitionBracket {
  const placed = members.filter((m): m is TransitionMember & { temperatureK: number } => m.temperatureK !== null);
  const lows = placed.filter((m) => m.phase === low);
  const highs = placed.filter((m) => m.phase === high);
  const belowMember = lows.reduce<(typeof lows)[number] | null>((best, m) => (!best || m.temperatureK > best.temperatureK ? m : best), null);
  const aboveMember = highs.reduce<(typeof highs)[number] | null>((best, m) => (!best || m.temperatureK < best.temperatureK ? m : best), null);
  const below = belowMember ? { trajectoryId: belowMember.trajectoryId, temperatureK: belowMember.temperatureK } : null;
  const above = aboveMember ? { trajectoryId: aboveMember.trajectoryId, temperatureK: aboveMember.temperatureK } : null;
  const where = branch === 'all' ? '' : ` on ${branch}`;
  if (!belowMember || !aboveMember) {
    const missing = !belowMember && !aboveMember ? `no ${low} and no ${high} member` : !belowMember ? `no ${low} member` : `no ${high} member`;
    return { branch, below, above, overlap: false, message: `Nothing to bracket${where}: ${missing}.` };
  }
  const overlap = aboveMember.temperatureK <= belowMember.temperatureK;
  const message = overlap
    ? `The runs overlap${where}: ${high} at ${K(aboveMember.temperatureK)} (${aboveMember.label}) is not above ${low} at ${K(belowMember.temperatureK)} (${belowMember.label}). ` +
      'This is hysteresis (superheating or supercooling) or an unequilibrated run; a two-phase run settles it.'
    : `Between ${K(belowMember.temperatureK)} (highest ${low}, ${belowMember.label}) and ${K(aboveMember.temperatureK)} (lowest ${high}, ${aboveMember.label})${where}.`;
  return { branch, below, above, overlap, message };
}

export function transitionBrackets(members: readonly TransitionMember[], kind: 'melting' | 'boiling'): TransitionResult {
  const [low, high]: [PhaseName, PhaseName] = kind === 'melting' ? ['solid', 'liquid'] : ['liquid', 'vapour'];
  const brackets = [bracket(members, 'all', low, high)];
  const branches = (['heating', 'cooling'] as const).filter((b) => members.some((m) => m.branch === b));
  for (const b of branches) brackets.push(bracket(members.filter((m) => m.branch === b), b, low, high));

  let hysteresisBounds: TransitionResult['hysteresisBounds'] = null;
  const heating = brackets.find((b) => b.branch === 'heating');
  const cooling = brackets.find((b) => b.branch === 'cooling');
  // On heating the high phase appears at or above the transition; on cooling the low phase appears at or below it.
  if (heating?.above && cooling?.below) {
    const lowerK = cooling.below.temperatureK, upperK = heating.above.temperatureK;
    hysteresisBounds = lowerK <= upperK
      ? { lowerK, upperK, message: `The ${kind} point lies between ${K(lowerK)} (highest ${low} on cooling) and ${K(upperK)} (lowest ${high} on heating).` }
      : { lowerK, upperK, message: `The branches disagree: ${low} on cooling at ${K(lowerK)} is above ${high} on heating at ${K(upperK)}; check that each run reached equilibrium.` };
  }
  return { kind, lowPhase: low, highPhase: high, brackets, hysteresisBounds, caution: kind === 'melting' ? MELTING_CAUTION : BOILING_CAUTION };
}
