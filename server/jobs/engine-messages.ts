import type { AnalysisKey, AnalysisParams } from '../../shared/analysis-params.ts';
import type { AnalysisRun, SimulationFacts } from '../analysis/index.ts';
import type { Trajectory } from '../analysis/trajectory.ts';
import type { BlockFileLayout } from '../out-of-core/block-file.ts';

/** What a job's thread asks its engine thread to do. */
export interface EngineRequest {
  /** Without `blocks`: a scratch file is opened again on the engine's side from `blockFile`. */
  trajectory: Trajectory;
  /** Where the coordinates are when they are not in memory. */
  blockFile?: BlockFileLayout;
  /** Analyses in the order they run; each inner list shares its intermediates. */
  stages: AnalysisKey[][];
  params: AnalysisParams;
  /** What the uploader stated about the simulation (temperature, constraints). */
  facts?: SimulationFacts;
}

export type EngineReply =
  | { kind: 'progress'; fraction: number }
  | { kind: 'done'; result: AnalysisRun }
  | { kind: 'failed'; message: string };
