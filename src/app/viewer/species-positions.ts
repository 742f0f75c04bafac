/** Copies the listed atoms' x, y, z into consecutive slots of `target`, so one species can be drawn from its own buffer. */
export function gatherPositions(target: Float32Array, atoms: Uint32Array, positions: Float32Array): void {
  for (let j = 0, o = 0; j < atoms.length; j++, o += 3) {
    const p = atoms[j]! * 3;
    target[o] = positions[p]!;
    target[o + 1] = positions[p + 1]!;
    target[o + 2] = positions[p + 2]!;
  }
}

/** For each species, the atoms that belong to it, in atom order. */
export function atomsBySpecies(speciesIndex: Uint16Array, speciesCount: number): Uint32Array[] {
  const counts = new Uint32Array(speciesCount);
  for (const s of speciesIndex) counts[s]!++;
  const lists = Array.from(counts, (n) => new Uint32Array(n));
  const filled = new Uint32Array(speciesCount);
  speciesIndex.forEach((s, atom) => {
    lists[s]![filled[s]!++] = atom;
  });
  return lists;
}
