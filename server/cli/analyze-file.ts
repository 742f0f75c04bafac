import { stat } from 'node:fs/promises';
import { basename } from 'node:path';
import { fileSha256 } from './file-sha256.ts';
import type { AnalysisKey, AnalysisParamsInput } from '../../shared/analysis-params.ts';
import { runAnalyses, type AnalysisRun, type SimulationFacts } from '../analysis/index.ts';
import { assembleTrajectory, type AssembleSpill } from '../formats/assemble.ts';
import { IN_MEMORY_COORDINATE_BYTES, withScratch } from '../out-of-core/scratch.ts';
import { thinBlocks } from '../out-of-core/thin.ts';
import { inspectTrajectory, type InspectResult } from '../formats/inspect.ts';
import { readFrames } from '../formats/read-frames.ts';
import { openTrajectory } from '../formats/open-trajectory.ts';
import { TrajectoryFormatError } from '../formats/frame.ts';
import type { Trajectory } from '../analysis/trajectory.ts';
import type { LengthUnit, TimeUnit, VelocityUnit } from '../formats/units.ts';
import { LENGTH_TO_ANGSTROM, TIME_TO_PS } from '../formats/units.ts';
import { planRun, PlanProblem, type PlannedRun, type TrajectoryFacts } from '../run-plan/plan-run.ts';
import { storedCurves } from '../services/report-curves.ts';
import type { ReportCurve } from '../../shared/report.ts';
import { reportTitle } from '../../shared/report-title.ts';
import { speciesElementsOf, type SpeciesElement } from '../../shared/trajectory.ts';

export interface AnalyzeFileOptions {
  analyses: AnalysisKey[];
  params: AnalysisParamsInput;
  lengthUnit: LengthUnit;
  timeUnit: TimeUnit;
  velocityUnit: VelocityUnit;
  /** Time between frames in `timeUnit`, when the file states none. */
  timeStep?: number;
  boundary?: 'periodic' | 'walls' | 'none';
  /** What the simulation states (temperature, constraints), as a trajectory's metadata would. */
  facts?: SimulationFacts;
}

/** The report document the API serves, less the ids that only exist on a server. */
export interface LocalReport {
  title: string;
  analyses: AnalysisKey[];
  params: AnalysisRun['methods']['params'];
  summary: AnalysisRun['summary'];
  methods: Record<string, unknown>;
  engineVersion: string;
  inputSha256: string;
  curves: Record<string, ReportCurve>;
}


/** What the file holds, as the planner needs it. */
function factsOf(info: InspectResult, options: AnalyzeFileOptions, timeStep: number): TrajectoryFacts {
  const toAngstrom = LENGTH_TO_ANGSTROM[options.lengthUnit];
  return {
    atoms: info.atoms, frames: info.frames, hasVelocities: info.hasVelocities,
    framePs: timeStep * TIME_TO_PS[options.timeUnit], cell: info.cell ? info.cell.map((v) => v * toAngstrom) : null,
  };
}

/** Reads any supported file, plans the run as the server would, and returns the plan without running it. */
export async function planFile(path: string, options: AnalyzeFileOptions): Promise<{ plan: PlannedRun; info: InspectResult; facts: TrajectoryFacts }> {
  const name = basename(path);
  const info = await inspectTrajectory(path, name);
  const timeStep = options.timeStep ?? info.timeStep;
  if (timeStep === undefined) throw new Error(`${name} states no time between frames: give it with --dt-ps`);
  const facts = factsOf(info, options, timeStep);
  try {
    return { plan: planRun(facts, options.analyses, options.params), info, facts };
  } catch (err) {
    if (err instanceof PlanProblem) throw new Error(`${name}: ${err.message}`);
    throw err;
  }
}

/** What the report says about the file. */
interface FileInfo {
  format: string;
  atoms: number;
  frames: number;
}

/** True when the options choose frames, so the file must be counted before it is read. */
function choosesFrames(params: AnalysisParamsInput): boolean {
  return params.fromFrame !== undefined || params.toFrame !== undefined || params.frameStride !== undefined || (params.discardPs ?? 0) > 0;
}

/**
 * Every frame in one pass: parse and assemble at once (no separate
 * inspection pass), then plan on what was read. Only a run longer than the
 * automatic stride limit is thinned afterwards.
 */
export async function readWhole(path: string, options: AnalyzeFileOptions, spill: AssembleSpill): Promise<{ traj: Trajectory; plan: PlannedRun; info: FileInfo }> {
  const name = basename(path);
  // Assembly copies each frame at once, so the reader may refill one pair of arrays.
  const opened = await openTrajectory(path, name, { transientFrames: true });
  // Uncompressed text: the file size and the first frames' offsets size the arrays once.
  const inputBytes = opened.compression === 'none' ? (await stat(path)).size : undefined;
  const timeStepPs = options.timeStep !== undefined ? options.timeStep * TIME_TO_PS[options.timeUnit] : undefined;
  let traj: Trajectory;
  try {
    traj = await assembleTrajectory(opened.frames, {
      length: options.lengthUnit, time: options.timeUnit, velocity: options.velocityUnit, timeStepPs, boundary: options.boundary,
    }, undefined, name, spill, { inputBytes });
  } catch (err) {
    if (err instanceof TrajectoryFormatError && /frames carry no time/.test(err.message)) throw new Error(`${name} states no time between frames: give it with --dt-ps`);
    throw err;
  }
  const facts: TrajectoryFacts = {
    atoms: traj.nAtoms, frames: traj.nFrames, hasVelocities: traj.velocities !== undefined,
    framePs: traj.nFrames > 1 ? (traj.times[traj.nFrames - 1]! - traj.times[0]!) / (traj.nFrames - 1) : timeStepPs ?? 1,
    cell: traj.cells ? traj.cells.subarray(0, 9) : null,
  };
  let plan: PlannedRun;
  try {
    plan = planRun(facts, options.analyses, options.params);
  } catch (err) {
    if (err instanceof PlanProblem) throw new Error(`${name}: ${err.message}`);
    throw err;
  }
  const info = { format: opened.format, atoms: traj.nAtoms, frames: traj.nFrames };
  const stride = plan.selection.stride;
  if (stride > 1) traj = traj.blocks ? await thinBlocks(traj, stride, spill, name) : everyNth(traj, stride);
  return { traj, plan, info };
}

/** Every stride-th frame of an assembled trajectory. */
function everyNth(t: Trajectory, stride: number): Trajectory {
  const frames = Math.ceil(t.nFrames / stride);
  const n3 = t.nAtoms * 3;
  const pick32 = (a: Float32Array) => {
    const out = new Float32Array(frames * n3);
    for (let f = 0; f < frames; f++) out.set(a.subarray(f * stride * n3, (f * stride + 1) * n3), f * n3);
    return out;
  };
  const pick64 = (a: Float64Array, width: number) => Float64Array.from({ length: frames * width }, (_, k) => a[Math.floor(k / width) * stride * width + (k % width)]!);
  const out: Trajectory = { ...t, nFrames: frames, positions: pick32(t.positions), times: pick64(t.times, 1), cells: t.cells ? pick64(t.cells, 9) : null };
  if (t.velocities) out.velocities = pick32(t.velocities);
  if (t.observables) out.observables = Object.fromEntries(Object.entries(t.observables).map(([k, v]) => [k, pick64(v, 1)]));
  return out;
}

/** The chosen frames only: counted by an inspection pass first, then read again stepping over the rest without parsing them. */
async function readSelected(path: string, options: AnalyzeFileOptions, spill: AssembleSpill): Promise<{ traj: Trajectory; plan: PlannedRun; info: FileInfo }> {
  const name = basename(path);
  const { plan, info, facts } = await planFile(path, options);
  const { selection } = plan;
  const frames = readFrames(path, { from: selection.from, to: selection.to, stride: selection.stride }, undefined, { name });
  const traj = await assembleTrajectory(frames, {
    length: options.lengthUnit, time: options.timeUnit, velocity: options.velocityUnit,
    timeStepPs: facts.framePs * selection.stride, boundary: options.boundary,
  }, { atoms: info.atoms, frames: selection.frames }, name, spill);
  return { traj, plan, info: { format: info.format, atoms: info.atoms, frames: info.frames } };
}

/** Reads any supported file, runs the same engine the server runs on the selected frames, and returns the report document. */
export async function analyzeFile(path: string, options: AnalyzeFileOptions): Promise<{ report: LocalReport; info: FileInfo; speciesElements: Record<string, SpeciesElement> }> {
  // Coordinates beyond the memory budget wait in a scratch file that goes when the report is made.
  return withScratch(IN_MEMORY_COORDINATE_BYTES, (spill) => analyzeWithin(path, options, spill));
}

async function analyzeWithin(path: string, options: AnalyzeFileOptions, spill: AssembleSpill): Promise<{ report: LocalReport; info: FileInfo; speciesElements: Record<string, SpeciesElement> }> {
  const name = basename(path);
  const [{ traj, plan, info }, inputSha256] = await Promise.all([
    choosesFrames(options.params) ? readSelected(path, options, spill) : readWhole(path, options, spill), fileSha256(path),
  ]);
  const { selection, params } = plan;
  const speciesElements = speciesElementsOf([...new Set(traj.species)], null);
  const run = runAnalyses(traj, options.analyses, params, undefined, options.facts);
  const framesUsed = { from: selection.from, to: selection.to, stride: selection.stride, used: selection.frames, discardedFrames: selection.discardFrames, discardPs: params.discardPs, autoStride: selection.autoStride };
  return {
    info,
    speciesElements,
    report: {
      title: reportTitle(name, options.analyses, run.methods.params),
      analyses: options.analyses,
      params: run.methods.params,
      summary: run.summary,
      methods: { ...run.methods, caution: run.caution, input: { file: name, sha256: inputSha256, format: info.format, atoms: info.atoms, frames: info.frames, speciesElements, ...options }, frames: framesUsed },
      engineVersion: run.engineVersion,
      inputSha256,
      // As stored reports are served: NaN becomes null.
      curves: storedCurves(run.curves),
    },
  };
}
