import { unlistedSpeciesColour } from '../../../shared/element-colour';
import { elementOf } from '../../../shared/elements';

export interface SpeciesStyle {
  /** #rrggbb */
  colour: string;
  /** Covalent radius in Å. */
  radiusA: number;
  /** False when the label names no element we know; the style is then a neutral stand-in. */
  known: boolean;
}

/** Stand-in for labels such as coarse-grained beads that name no element. */
const UNKNOWN: SpeciesStyle = { colour: unlistedSpeciesColour(), radiusA: 1, known: false };

/** Spheres are drawn at this fraction of the covalent radius so neighbours stay apart. */
export const SPHERE_SCALE = 0.5;

export function speciesStyle(label: string): SpeciesStyle {
  try {
    const element = elementOf(label);
    return { colour: element.colour, radiusA: element.covalentRadiusA, known: true };
  } catch {
    return UNKNOWN;
  }
}
