import { simulateLennardJones, type LennardJonesOptions } from '../../server/simulate/lennard-jones.ts';
import { trajectoryToFrames } from '../../server/simulate/to-frames.ts';
import { writeExtxyz } from '../../server/formats/write-extxyz.ts';

/** A small liquid-argon-like run written as extended XYZ with velocities. */
export async function lennardJonesExtxyz(overrides: Partial<LennardJonesOptions> = {}) {
  const run = simulateLennardJones({
    cellsPerSide: 3, reducedDensity: 0.8442, temperatureK: 86.5, meltTemperatureK: 250, meltSteps: 200,
    equilibrationSteps: 400, productionSteps: 2000, sampleEvery: 10, seed: 7, ...overrides,
  });
  const chunks: Uint8Array[] = [];
  for await (const chunk of writeExtxyz(trajectoryToFrames(run.trajectory))) chunks.push(chunk);
  return { run, bytes: Buffer.concat(chunks) };
}
