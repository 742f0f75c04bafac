/**
 * Runs in its own process so the PDB and XYZ readers are compared on an
 * equal footing: a fresh runtime, not one whose heap and compiled code carry
 * whatever the suites before it did. Reads the two files given (the same
 * positions as PDB and as plain XYZ), best of three each, taken in turns,
 * and prints JSON.
 */
import { readFrames } from '../server/formats/read-frames.ts';

const [pdbPath, xyzPath] = process.argv.slice(2) as [string, string];

async function countFrames(path: string): Promise<number> {
  let frames = 0;
  for await (const frame of readFrames(path)) frames += frame.positions.length > 0 ? 1 : 0;
  return frames;
}

async function timed(path: string): Promise<[number, number]> {
  const start = performance.now();
  const frames = await countFrames(path);
  return [frames, (performance.now() - start) / 1000];
}

let pdbSeconds = Infinity;
let xyzSeconds = Infinity;
let pdbFrames = 0;
let xyzFrames = 0;
for (let round = 0; round < 3; round++) {
  const [p, ps] = await timed(pdbPath);
  const [x, xs] = await timed(xyzPath);
  pdbFrames = p;
  xyzFrames = x;
  pdbSeconds = Math.min(pdbSeconds, ps);
  xyzSeconds = Math.min(xyzSeconds, xs);
}
process.stdout.write(JSON.stringify({ pdbFrames, xyzFrames, pdbSeconds, xyzSeconds }));
