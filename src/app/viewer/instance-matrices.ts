/**
 * Instance matrices of one species' spheres, written straight into the
 * InstancedMesh's Float32Array (column-major 4×4 per instance): a uniform
 * scale on the diagonal and the atom's position as the translation. Frames
 * only rewrite the translations, so playback allocates nothing.
 */

/** Sets every matrix to scale × identity at the origin. */
export function initialiseScaledMatrices(target: Float32Array, count: number, scale: number): void {
  target.fill(0, 0, count * 16);
  for (let j = 0, o = 0; j < count; j++, o += 16) {
    target[o] = scale;
    target[o + 5] = scale;
    target[o + 10] = scale;
    target[o + 15] = 1;
  }
}

/** Copies the positions of the listed atoms into the translation column of consecutive matrices. */
export function writeTranslations(target: Float32Array, atoms: Uint32Array, positions: Float32Array): void {
  for (let j = 0, o = 12; j < atoms.length; j++, o += 16) {
    const p = atoms[j]! * 3;
    target[o] = positions[p]!;
    target[o + 1] = positions[p + 1]!;
    target[o + 2] = positions[p + 2]!;
  }
}
