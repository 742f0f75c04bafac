import type { TrajectoryMetadata } from '../../shared/trajectory.ts';
import type { AnalysisKey } from '../../shared/analysis-params.ts';
import type { Trajectory } from '../analysis/trajectory.ts';
import { writeExtxyz } from '../formats/write-extxyz.ts';
import { simulateHarmonicDiatomics } from '../simulate/harmonic-diatomics.ts';
import { simulateLennardJones } from '../simulate/lennard-jones.ts';
import { trajectoryToFrames } from '../simulate/to-frames.ts';

/** One invented demo run: how to make it, how it is described, what to analyse. */
export interface DemoTrajectory {
  project: string;
  fileName: string;
  metadata: TrajectoryMetadata;
  analyses: AnalysisKey[];
  simulate(): Trajectory;
}

const LJ = 'Lennard-Jones 12-6, σ = 3.405 Å, ε/k_B = 119.8 K, cut-off 2.5σ, shifted';
const ENGINE = 'Larkspur teaching integrator (velocity Verlet)';

/**
 * The argon runs' interaction model, exactly what their integrator used, so
 * the energy analysis recomputes the energies written into each frame.
 */
export const DEMO_ARGON_MODEL = {
  name: 'Argon, LJ 12-6 (Rowley–Nicholson–Parsonage), as run',
  source: 'Rowley, Nicholson & Parsonage, J. Comput. Phys. 17, 401 (1975); cut-off 2.5σ, shifted, as in the Larkspur integrator',
  pairs: [{ species: ['Ar', 'Ar'] as [string, string], form: 'lj' as const, epsilonK: 119.8, sigmaA: 3.405, cutoffA: 2.5 * 3.405, truncation: 'shifted' as const }],
};

/** The integrator's own potential energy (eV) travels with each frame as energy=, as simulation codes write it. */
function argonRun(temperatureK: number, reducedDensity: number, seed: number) {
  return () => {
    const run = simulateLennardJones({
      cellsPerSide: 4, reducedDensity, temperatureK, meltTemperatureK: temperatureK > 70 ? 250 : undefined,
      meltSteps: temperatureK > 70 ? 300 : 0, equilibrationSteps: 600, productionSteps: 4000, sampleEvery: 10, seed,
    });
    return { ...run.trajectory, observables: { energy: run.potentialEV } };
  };
}

export const DEMO_TRAJECTORIES: DemoTrajectory[] = [
  {
    project: 'Noble-liquid benchmark', fileName: 'argon-like-40K-solid.extxyz', analyses: ['thermo', 'msd', 'vacf', 'vdos', 'rdf', 'sq', 'lindemann', 'energy'],
    metadata: { temperatureK: 40, ensemble: 'NVE', potential: LJ, engine: ENGINE, notes: 'Invented demo run: FCC solid well below melting.' },
    simulate: argonRun(40, 1.05, 11),
  },
  {
    project: 'Noble-liquid benchmark', fileName: 'argon-like-90K-liquid.extxyz', analyses: ['thermo', 'msd', 'vacf', 'vdos', 'rdf', 'sq', 'lindemann', 'ngp', 'energy'],
    metadata: { temperatureK: 90, ensemble: 'NVE', potential: LJ, engine: ENGINE, notes: 'Invented demo run: liquid near the triple point.' },
    simulate: argonRun(90, 0.8442, 12),
  },
  {
    project: 'Noble-liquid benchmark', fileName: 'argon-like-130K-hot-liquid.extxyz', analyses: ['thermo', 'msd', 'vacf', 'vdos', 'rdf', 'sq', 'lindemann', 'energy'],
    metadata: { temperatureK: 130, ensemble: 'NVE', potential: LJ, engine: ENGINE, notes: 'Invented demo run: hot, less dense liquid.' },
    simulate: argonRun(130, 0.75, 13),
  },
  {
    project: 'Small-molecule vibrations', fileName: 'model-diatomics-300K.extxyz', analyses: ['thermo', 'vacf', 'vdos'],
    metadata: {
      temperatureK: 300, ensemble: 'NVE', potential: 'Harmonic bond, 2143 cm⁻¹ model stretch (invented)', engine: ENGINE,
      // The molecules never rotate: two rotational degrees of freedom per molecule are frozen.
      constraints: 2 * 64,
      notes: 'Invented demo run: 64 non-rotating harmonic C–O model molecules, for a sharp VDOS line.',
    },
    simulate: () => simulateHarmonicDiatomics({
      molecules: 64, speciesA: 'C', speciesB: 'O', wavenumberCm1: 2143, bondLengthA: 1.128, temperatureK: 300,
      timeStepPs: 0.0005, frames: 4096, integrator: 'analytic', boxA: 20, seed: 21,
    }).trajectory,
  },
];

export async function toExtxyzBytes(trajectory: Trajectory): Promise<Buffer> {
  const chunks: Uint8Array[] = [];
  for await (const chunk of writeExtxyz(trajectoryToFrames(trajectory, trajectory.observables))) chunks.push(chunk);
  return Buffer.concat(chunks);
}
