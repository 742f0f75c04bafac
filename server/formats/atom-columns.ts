/**
 * Which column of an atom line feeds which field. Roles are small integers
 * so the hot loop dispatches on a typed array instead of strings.
 */
export const COLUMN = { skip: 0, species: 1, x: 2, y: 3, z: 4, vx: 5, vy: 6, vz: 7 } as const;

export interface AtomColumns {
  /** Role per column, up to the last column that is used; later columns are ignored. */
  roles: Int8Array;
  hasVelocities: boolean;
  /** Human-readable column list for error messages. */
  description: string;
}
