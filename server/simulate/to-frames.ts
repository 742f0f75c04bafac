import type { Trajectory } from '../analysis/trajectory.ts';
import type { Frame } from '../formats/frame.ts';

/**
 * A simulated trajectory as reader frames (Å, Å/ps, ps), e.g. to write it out
 * as extended XYZ; `values` adds per-frame numbers such as the energy (eV).
 */
export function* trajectoryToFrames(traj: Trajectory, values: Record<string, Float64Array> = {}): Generator<Frame> {
  const n3 = traj.nAtoms * 3;
  for (let f = 0; f < traj.nFrames; f++) {
    yield {
      index: f,
      positions: traj.positions.subarray(f * n3, (f + 1) * n3),
      velocities: traj.velocities?.subarray(f * n3, (f + 1) * n3),
      species: traj.species,
      cell: traj.cells ? traj.cells.slice(f * 9, f * 9 + 9) : null,
      pbc: traj.boundary === 'periodic' ? [true, true, true] : [false, false, false],
      time: traj.times[f],
      ...(Object.keys(values).length ? { values: Object.fromEntries(Object.entries(values).map(([k, v]) => [k, v[f]])) } : {}),
    };
  }
}
