import { writeExtxyz } from '../../server/formats/write-extxyz.ts';
import { SeededRandom } from '../../server/simulate/random.ts';
import type { Frame } from '../../server/formats/frame.ts';

export interface RandomWalkOptions {
  atoms: number;
  frames: number;
  /** Self-diffusion coefficient the walk is built with, Å²/ps. */
  diffusionA2PerPs: number;
  timeStepPs: number;
  boxA: number;
  seed: number;
}

/**
 * Gaussian random walkers in a periodic box, written wrapped as extended XYZ:
 * each Cartesian step has variance 2·D·Δt, so MSD(t) = 6·D·t exactly in
 * expectation (Einstein relation; COMMON PRACTICE). Positions are wrapped
 * into the box so the reader of the file must unwrap them.
 */
export async function randomWalkExtxyz(o: RandomWalkOptions): Promise<Buffer> {
  const random = new SeededRandom(o.seed);
  const sigma = Math.sqrt(2 * o.diffusionA2PerPs * o.timeStepPs);
  const unwrapped = new Float64Array(o.atoms * 3);
  for (let i = 0; i < unwrapped.length; i++) unwrapped[i] = random.uniform() * o.boxA;
  const cell = Float64Array.from([o.boxA, 0, 0, 0, o.boxA, 0, 0, 0, o.boxA]);
  const species = Array.from({ length: o.atoms }, () => 'Ar');
  function* frames(): Generator<Frame> {
    for (let f = 0; f < o.frames; f++) {
      if (f > 0) for (let i = 0; i < unwrapped.length; i++) unwrapped[i]! += sigma * random.normal();
      const positions = unwrapped.map((x) => x - o.boxA * Math.floor(x / o.boxA));
      yield { index: f, positions, species, cell, pbc: [true, true, true], time: f * o.timeStepPs };
    }
  }
  const chunks: Uint8Array[] = [];
  for await (const chunk of writeExtxyz(frames())) chunks.push(chunk);
  return Buffer.concat(chunks);
}
