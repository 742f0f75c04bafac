/**
 * One rule for the degrees of freedom that kinetic energy is shared over,
 * used by the temperature series and the VDOS alike (SCIENCE item 8
 * [COMMON PRACTICE]): f = 3N − N_c − 3, the last 3 when the centre-of-mass
 * motion is removed. N_c counts holonomic constraints of the simulation —
 * 3 per rigid water, 2 per diatomic whose rotation is frozen — and is
 * stated with the trajectory; an explicit count replaces the rule.
 *
 * A group of atoms (a species, a selection) gets its share n/N of the
 * total, and analyses over d < 3 Cartesian components the share d/3.
 */

export interface DegreesOfFreedomInput {
  /** Atoms in the whole trajectory. */
  nAtoms: number;
  removeComDrift: boolean;
  /** Holonomic constraints of the whole system. */
  constraints?: number | null;
  /** An explicit total for the whole system in 3-D, replacing the rule. */
  degreesOfFreedom?: number | null;
}

export interface DegreesOfFreedom {
  /** Total for the whole system in 3-D. */
  total: number;
  /** How the total was arrived at, in words (for the methods text). */
  rule: string;
}

export function degreesOfFreedom(input: DegreesOfFreedomInput): DegreesOfFreedom {
  if (input.degreesOfFreedom !== undefined && input.degreesOfFreedom !== null) {
    if (!(input.degreesOfFreedom > 0)) throw new Error('Degrees of freedom must be positive.');
    return { total: input.degreesOfFreedom, rule: `given: ${input.degreesOfFreedom}` };
  }
  const c = input.constraints ?? 0;
  const com = input.removeComDrift ? 3 : 0;
  const total = 3 * input.nAtoms - c - com;
  if (!(total > 0)) throw new Error(`3N − constraints${com ? ' − 3' : ''} = ${total} degrees of freedom: fewer than one; check the constraints.`);
  const parts = [`3·${input.nAtoms}`];
  if (c) parts.push(`${c} constraints`);
  if (com) parts.push('3 (centre of mass)');
  return { total, rule: `${parts.join(' − ')} = ${total}` };
}

/** The share of a group of n atoms analysed over d components. */
export function groupShare(dof: DegreesOfFreedom, nAtomsInGroup: number, nAtoms: number, dimensions = 3): number {
  return (dof.total * nAtomsInGroup * dimensions) / (nAtoms * 3);
}
