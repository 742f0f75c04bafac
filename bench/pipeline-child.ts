/**
 * Runs in its own process so its peak RSS is the pipeline's alone: read an
 * extended XYZ file, assemble it in engine units and run msd, vacf, vdos,
 * rdf and thermo, as an analysis job does. With `--baseline` it only loads
 * the same modules, to measure the runtime's own footprint in the same run.
 */
import { assembleTrajectory } from '../server/formats/assemble.ts';
import { inspectTrajectory } from '../server/formats/inspect.ts';
import { openTrajectory } from '../server/formats/open-trajectory.ts';
import { runAnalyses } from '../server/analysis/index.ts';

const [path, mode] = process.argv.slice(2);
if (mode === '--baseline') {
  process.stdout.write(JSON.stringify({ peakRssMb: process.resourceUsage().maxRSS / 1024 }));
} else {
  const t0 = performance.now();
  const info = await inspectTrajectory(path!, 'bench.extxyz');
  const opened = await openTrajectory(path!, 'bench.extxyz');
  const traj = await assembleTrajectory(opened.frames, { length: 'angstrom', time: 'ps', velocity: 'angstrom/ps', timeStepPs: 0.01 }, { atoms: info.atoms, frames: info.frames });
  const t1 = performance.now();
  runAnalyses(traj, ['msd', 'vacf', 'vdos', 'rdf', 'thermo'], { rMaxA: 9 });
  const t2 = performance.now();
  const float32Bytes = traj.positions.byteLength + (traj.velocities?.byteLength ?? 0);
  process.stdout.write(JSON.stringify({
    readSeconds: (t1 - t0) / 1000, analyseSeconds: (t2 - t1) / 1000, float32Mb: float32Bytes / 2 ** 20,
    peakRssMb: process.resourceUsage().maxRSS / 1024,
  }));
}
