/** Copies the listed atoms' x, y, z into consecutive slots of `target`, so one species can be drawn from its own buffer. */
export function gatherPositions(target: Float32Array, atoms: Uint32Array, positions: Float32Array): void {
  for (let j = 0, o = 0; j < atoms.length; j++, o += 3) {
    const p = atoms[j]! * 3;
    target[o] = positions[p]!;
    target[o + 1] = positions[p + 1]!;
    target[o + 2] = positions[p + 2]!;
  }
}
