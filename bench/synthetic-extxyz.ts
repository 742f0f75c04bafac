/**
 * Synthetic extended XYZ for the reader benchmarks: water-like frames
 * with velocities, deterministic, rendered once into a pool and cycled
 * (with each frame's own Time=) so large inputs cost no generation time.
 */
export const BENCH_ATOMS = 500;
const POOL_FRAMES = 32;

function lcg(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return state / 2 ** 32;
  };
}

function atomLines(rnd: () => number): string {
  const species = ['O', 'H', 'H'];
  let out = '';
  for (let a = 0; a < BENCH_ATOMS; a++) {
    out += species[a % 3];
    for (let k = 0; k < 3; k++) out += ` ${(rnd() * 24).toFixed(8).padStart(13)}`;
    for (let k = 0; k < 3; k++) out += ` ${(rnd() * 2 - 1).toFixed(8).padStart(12)}`;
    out += '\n';
  }
  return out;
}

/** Frames in order, each a Buffer, until `frames` have been produced. */
export function* syntheticFrames(frames: number, seed = 12345): Generator<Buffer> {
  const rnd = lcg(seed);
  const pool = Array.from({ length: POOL_FRAMES }, () => Buffer.from(atomLines(rnd)));
  for (let f = 0; f < frames; f++) {
    const header = `${BENCH_ATOMS}\nLattice="24.0 0.0 0.0 0.0 24.0 0.0 0.0 0.0 24.0" Properties=species:S:1:pos:R:3:velo:R:3 Time=${(f * 0.01).toFixed(2)} pbc="T T T"\n`;
    yield Buffer.concat([Buffer.from(header), pool[f % POOL_FRAMES]]);
  }
}
