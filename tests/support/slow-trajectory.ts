import { writeExtxyz } from '../../server/formats/write-extxyz.ts';
import { fccLattice } from '../../server/simulate/fcc-lattice.ts';
import { SeededRandom } from '../../server/simulate/random.ts';
import type { Frame } from '../../server/formats/frame.ts';

/**
 * A jittered FCC crystal big enough that an analysis takes a few seconds,
 * so a test can act on a job while it runs.
 */
export async function jitteredCrystalExtxyz(cellsPerSide = 6, frames = 600): Promise<Buffer> {
  const a = 5.26;
  const base = fccLattice(cellsPerSide, a);
  const n = base.length / 3;
  const box = cellsPerSide * a;
  const random = new SeededRandom(99);
  const cell = Float64Array.from([box, 0, 0, 0, box, 0, 0, 0, box]);
  const species = Array.from({ length: n }, () => 'Ar');
  function* all(): Generator<Frame> {
    for (let f = 0; f < frames; f++) {
      const positions = new Float64Array(base.length);
      for (let i = 0; i < base.length; i++) positions[i] = base[i]! + 0.1 * random.normal();
      yield { index: f, positions, species, cell, pbc: [true, true, true], time: f * 0.01 };
    }
  }
  const chunks: Uint8Array[] = [];
  for await (const chunk of writeExtxyz(all())) chunks.push(chunk);
  return Buffer.concat(chunks);
}
