/** Picoseconds per unit of each time unit the trajectory metadata allows. */
const PS_PER_UNIT: Readonly<Record<string, number>> = {
  fs: 1e-3,
  ps: 1,
  ns: 1e3,
  // Atomic unit of time ħ/E_h = 2.4188843265864e-17 s (CODATA 2022).
  au: 2.4188843265864e-5,
};

/**
 * Time of a frame in ps: the time stated in the file, else the frame index
 * times the time between saved frames, else null when neither is known.
 */
export function frameTimePs(frame: { index: number; time: number | null }, timeStep: number | null, timeUnit: string): number | null {
  const scale = PS_PER_UNIT[timeUnit];
  if (scale === undefined) return null;
  if (frame.time !== null) return frame.time * scale;
  if (timeStep !== null) return frame.index * timeStep * scale;
  return null;
}
