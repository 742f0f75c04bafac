import { createHash } from 'node:crypto';
import { createReadStream } from 'node:fs';
import { basename } from 'node:path';
import type { AnalysisKey, AnalysisParamsInput } from '../../shared/analysis-params.ts';
import { runAnalyses, type AnalysisRun, type SimulationFacts } from '../analysis/index.ts';
import { assembleTrajectory } from '../formats/assemble.ts';
import { inspectTrajectory, type InspectResult } from '../formats/inspect.ts';
import { openTrajectory } from '../formats/open-trajectory.ts';
import type { LengthUnit, TimeUnit, VelocityUnit } from '../formats/units.ts';
import { TIME_TO_PS } from '../formats/units.ts';
import { encodeCurves, decodeCurves } from '../services/report-curves.ts';
import type { ReportCurve } from '../../shared/report.ts';

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

async function sha256Of(path: string): Promise<string> {
  const hash = createHash('sha256');
  for await (const chunk of createReadStream(path)) hash.update(chunk as Buffer);
  return hash.digest('hex');
}

/** Reads any supported file, runs the same engine the server runs, and returns the report document. */
export async function analyzeFile(path: string, options: AnalyzeFileOptions): Promise<{ report: LocalReport; info: InspectResult }> {
  const name = basename(path);
  const [info, inputSha256] = await Promise.all([inspectTrajectory(path, name), sha256Of(path)]);
  const opened = await openTrajectory(path, name);
  const timeStep = options.timeStep ?? info.timeStep;
  if (timeStep === undefined) throw new Error(`${name} states no time between frames: give it with --dt-ps`);
  const traj = await assembleTrajectory(opened.frames, {
    length: options.lengthUnit, time: options.timeUnit, velocity: options.velocityUnit,
    timeStepPs: timeStep ? timeStep * TIME_TO_PS[options.timeUnit] : undefined, boundary: options.boundary,
  }, { atoms: info.atoms, frames: info.frames }, name);
  const run = runAnalyses(traj, options.analyses, options.params, undefined, options.facts);
  return {
    info,
    report: {
      title: `${name}: ${options.analyses.join(', ')}`,
      analyses: options.analyses,
      params: run.methods.params,
      summary: run.summary,
      methods: { ...run.methods, caution: run.caution, input: { file: name, sha256: inputSha256, format: info.format, atoms: info.atoms, frames: info.frames, ...options } },
      engineVersion: run.engineVersion,
      inputSha256,
      // Same encoding as stored reports, so NaN becomes null exactly as the API serves it.
      curves: decodeCurves(encodeCurves(run.curves)),
    },
  };
}
