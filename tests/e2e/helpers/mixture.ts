/**
 * Relabels a one-species extended XYZ file as a three-species mixture (every
 * atom by its index: Ar, Kr, Ne in turn), so screens meet several species
 * without a simulation of their own.
 */
export function asThreeSpecies(extxyz: Buffer): Buffer {
  const labels = ['Ar', 'Kr', 'Ne'];
  let atom = 0;
  const lines = extxyz.toString('utf8').split('\n').map((line) => {
    if (!/^Ar\s/.test(line)) {
      atom = 0;
      return line;
    }
    return labels[atom++ % labels.length] + line.slice(2);
  });
  return Buffer.from(lines.join('\n'));
}
