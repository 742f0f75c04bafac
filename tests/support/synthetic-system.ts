/**
 * A synthetic argon-like system of any size for the frame viewer's tests and benchmark: atoms on a
 * jittered simple-cubic grid at liquid density, wandering a little from
 * frame to frame, written as extended XYZ with a cubic cell and Time=.
 */

/** Number density of liquid argon near its triple point, Å⁻³. */
const DENSITY = 0.021;

function lcg(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return state / 2 ** 32;
  };
}

/** The whole file in memory: a 50 000-atom frame is about 2 MB of text. */
export function syntheticSystemExtxyz(atoms: number, frames: number, seed = 2024): Buffer {
  const rnd = lcg(seed);
  const box = Math.cbrt(atoms / DENSITY);
  const perSide = Math.ceil(Math.cbrt(atoms));
  const spacing = box / perSide;
  const positions = new Float64Array(atoms * 3);
  for (let a = 0; a < atoms; a++) {
    const cell = [a % perSide, Math.floor(a / perSide) % perSide, Math.floor(a / perSide ** 2)];
    for (let k = 0; k < 3; k++) positions[a * 3 + k] = (cell[k]! + 0.5 + (rnd() - 0.5) * 0.3) * spacing;
  }
  const header = (f: number) => `${atoms}\nLattice="${box.toFixed(4)} 0 0 0 ${box.toFixed(4)} 0 0 0 ${box.toFixed(4)}" `
    + `Properties=species:S:1:pos:R:3 Time=${(f * 0.1).toFixed(2)} pbc="T T T"\n`;
  const chunks: Buffer[] = [];
  for (let f = 0; f < frames; f++) {
    const lines: string[] = [header(f)];
    for (let a = 0; a < atoms; a++) {
      for (let k = 0; k < 3; k++) {
        const i = a * 3 + k;
        positions[i] = (positions[i]! + (rnd() - 0.5) * 0.4 + box) % box;
      }
      lines.push(`Ar ${positions[a * 3]!.toFixed(4)} ${positions[a * 3 + 1]!.toFixed(4)} ${positions[a * 3 + 2]!.toFixed(4)}\n`);
    }
    chunks.push(Buffer.from(lines.join('')));
  }
  return Buffer.concat(chunks);
}
