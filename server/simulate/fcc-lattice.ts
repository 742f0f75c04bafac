/** Face-centred cubic lattice sites of an n×n×n supercell with lattice constant a (Å), 4n³ sites. */
export function fccLattice(cellsPerSide: number, latticeA: number): Float64Array {
  const n = cellsPerSide;
  const basis = [0, 0, 0, 0.5, 0.5, 0, 0.5, 0, 0.5, 0, 0.5, 0.5];
  const out = new Float64Array(12 * n * n * n);
  let p = 0;
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++)
      for (let k = 0; k < n; k++)
        for (let b = 0; b < 4; b++) {
          out[p++] = (i + basis[3 * b]) * latticeA;
          out[p++] = (j + basis[3 * b + 1]) * latticeA;
          out[p++] = (k + basis[3 * b + 2]) * latticeA;
        }
  return out;
}
