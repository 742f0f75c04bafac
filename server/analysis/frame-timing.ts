/**
 * The correlators assume evenly spaced frames; an uneven file would silently
 * distort every lag axis, so it is rejected here with a readable message.
 */
import type { Trajectory } from './trajectory.ts';

export function frameIntervalPs(traj: Trajectory): number {
  const t = traj.times;
  if (traj.nFrames < 2) return 0;
  const dt = (t[traj.nFrames - 1] - t[0]) / (traj.nFrames - 1);
  if (!(dt > 0)) throw new Error('Frame times must increase.');
  const tolerance = 1e-4 * dt;
  for (let f = 1; f < traj.nFrames; f++) {
    if (Math.abs(t[f] - t[f - 1] - dt) > tolerance) {
      throw new Error(`Frames are not evenly spaced in time (frame ${f}); resample the trajectory first.`);
    }
  }
  return dt;
}

/** Lag count (including lag 0) for a maximum lag in ps, capped by the data. */
export function lagCount(nFrames: number, dtPs: number, maxLagPs: number | undefined, defaultFraction: number): number {
  const cap = Math.max(1, Math.floor((nFrames - 1) * defaultFraction) + 1);
  if (maxLagPs === undefined || dtPs === 0) return Math.min(nFrames, cap);
  return Math.max(1, Math.min(nFrames, Math.floor(maxLagPs / dtPs + 1e-9) + 1));
}
