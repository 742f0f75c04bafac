/**
 * Every stride-th frame of an assembled trajectory whose coordinates are
 * in a scratch file, into a new (smaller) one: frames are read a block at
 * a time and assembled again, so memory stays bounded.
 */
import { FrameCursor } from '../analysis/coordinate-blocks.ts';
import type { Trajectory } from '../analysis/trajectory.ts';
import { assembleTrajectory, type AssembleSpill } from '../formats/assemble.ts';
import type { Frame } from '../formats/frame.ts';

function* strided(t: Trajectory, stride: number): Generator<Frame> {
  const positions = new FrameCursor(t, 'positions');
  const velocities = t.velocities ? new FrameCursor(t, 'velocities') : null;
  const n3 = 3 * t.nAtoms;
  for (let f = 0; f < t.nFrames; f += stride) {
    const p = positions.frame(f);
    const frame: Frame = { index: f, species: t.species, positions: p.data.subarray(p.offset, p.offset + n3), cell: t.cells ? t.cells.subarray(9 * f, 9 * f + 9) : null, time: t.times[f] };
    if (velocities) {
      const v = velocities.frame(f);
      frame.velocities = v.data.subarray(v.offset, v.offset + n3);
    }
    if (t.observables) frame.values = Object.fromEntries(Object.entries(t.observables).filter(([, s]) => !Number.isNaN(s[f])).map(([k, s]) => [k, s[f]!]));
    yield frame;
  }
}

export async function thinBlocks(t: Trajectory, stride: number, spill: AssembleSpill, file: string): Promise<Trajectory> {
  const frames = Math.ceil(t.nFrames / stride);
  const thinned = await assembleTrajectory(strided(t, stride), { length: 'angstrom', time: 'ps', velocity: 'angstrom/ps', boundary: t.boundary }, { atoms: t.nAtoms, frames }, file, spill);
  return thinned;
}
