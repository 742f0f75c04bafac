/**
 * Which atoms an analysis covers and how results are grouped: "all" (the
 * selection) first, then one group per species present in it. Masses are
 * resolved once here so every module uses the same numbers.
 */
import type { ComponentSet } from '../../shared/analysis-params.ts';
import { massOf } from '../../shared/elements.ts';
import type { Trajectory } from './trajectory.ts';

export interface AtomGroup {
  label: string;
  atoms: Int32Array;
}

export interface Selection {
  /** Selected atom indices. */
  atoms: Int32Array;
  /** "all" first, then per species in order of first appearance. */
  groups: AtomGroup[];
  /** Mass per atom of the whole trajectory, u. */
  masses: Float64Array;
}

export function selectAtoms(traj: Trajectory, species: readonly string[] | undefined, massOverrides?: Readonly<Record<string, number>>): Selection {
  if (traj.species.length !== traj.nAtoms) throw new Error('Species list length differs from the atom count.');
  const masses = new Float64Array(traj.nAtoms);
  const cache = new Map<string, number>();
  for (let i = 0; i < traj.nAtoms; i++) {
    const label = traj.species[i];
    let m = cache.get(label);
    if (m === undefined) {
      m = massOf(label, massOverrides);
      cache.set(label, m);
    }
    masses[i] = m;
  }
  const wanted = species && species.length > 0 ? new Set(species) : null;
  if (wanted) {
    for (const s of wanted) if (!traj.species.includes(s)) throw new Error(`Species "${s}" is not in this trajectory.`);
  }
  const picked: number[] = [];
  const bySpecies = new Map<string, number[]>();
  for (let i = 0; i < traj.nAtoms; i++) {
    const s = traj.species[i];
    if (wanted && !wanted.has(s)) continue;
    picked.push(i);
    let list = bySpecies.get(s);
    if (!list) bySpecies.set(s, (list = []));
    list.push(i);
  }
  if (picked.length === 0) throw new Error('No atoms selected.');
  const groups: AtomGroup[] = [{ label: 'all', atoms: Int32Array.from(picked) }];
  if (bySpecies.size > 1 || wanted) {
    for (const [label, list] of bySpecies) groups.push({ label, atoms: Int32Array.from(list) });
  }
  return { atoms: Int32Array.from(picked), groups, masses };
}

/** Cartesian components an analysis uses; lateral diffusion in a membrane uses "xy". */
export type Components = ComponentSet;

export function componentIndices(c: Components): number[] {
  return [...c].map((ch) => 'xyz'.indexOf(ch));
}
