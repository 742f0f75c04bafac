import type { Frame } from '../../server/formats/frame.ts';
import { writeExtxyz } from '../../server/formats/write-extxyz.ts';
import { SeededRandom } from '../../server/simulate/random.ts';

/**
 * Frames of a gas whose velocities start `excess + 1` times too fast and
 * relax as e^(−f/tau): a run that needs its start discarded.
 */
export async function relaxingRunExtxyz({ atoms = 64, frames = 400, tau = 30, excess = 2, seed = 3 } = {}): Promise<Buffer> {
  const random = new SeededRandom(seed);
  const box = 14;
  const species = new Array<string>(atoms).fill('Ar');
  const cell = Float64Array.from([box, 0, 0, 0, box, 0, 0, 0, box]);
  function* all(): Generator<Frame> {
    for (let f = 0; f < frames; f++) {
      const scale = 1 + excess * Math.exp(-f / tau);
      const positions = Float64Array.from({ length: 3 * atoms }, () => random.uniform() * box);
      const velocities = Float64Array.from({ length: 3 * atoms }, () => scale * random.normal());
      yield { index: f, positions, velocities, species, cell, pbc: [true, true, true], time: f * 0.01 };
    }
  }
  const chunks: Uint8Array[] = [];
  for await (const c of writeExtxyz(all())) chunks.push(c);
  return Buffer.concat(chunks);
}
