import { UnrecoverableError, WaitingError, type SandboxedJob } from 'bullmq';
import { analysisParamsSchema, type AnalysisKey } from '../../../shared/analysis-params.ts';
import { selectFrames, type FrameSelection } from '../../../shared/frame-selection.ts';
import { reportTitle } from '../../../shared/report-title.ts';
import type { AppContext } from '../../context.ts';
import type { TrajectoryRow } from '../../db/schema/index.ts';
import { TrajectoryFormatError, type Frame } from '../../formats/frame.ts';
import { assembleTrajectory, type AssembleSpill } from '../../formats/assemble.ts';
import { ScratchTooSmall, withScratch } from '../../out-of-core/scratch.ts';
import { TIME_TO_PS, type LengthUnit, type TimeUnit, type VelocityUnit } from '../../formats/units.ts';
import { claimRun, completeRun, failRun, recordProgress, releaseRun, RunLost, runLostReason } from '../../services/analysis-runs.ts';
import { trajectoryFacts } from '../../services/run-costs.ts';
import { storedFrames } from '../../services/stored-trajectory.ts';
import { encodeCurves } from '../../services/report-curves.ts';
import { getTrajectoryRow } from '../../services/trajectories.ts';
import { curvesKeyFor } from '../../storage/object-keys.ts';
import { EngineFailure, runInEngineThread } from '../engine-runner.ts';
import { AttemptReleased, releaseRequested, type JobAttempt } from '../job-attempt.ts';
import type { AnalyseJobData } from '../queue.ts';

/** Analyses that share an intermediate run together: VDOS needs the VACF, S(q) needs g(r). */
const STAGES: AnalysisKey[][] = [['thermo'], ['msd'], ['vacf', 'vdos'], ['rdf', 'sq'], ['lindemann'], ['ngp'], ['energy']];
const LOAD_SHARE = 25;
/** Progress reaches the database at most this often; each write is also the check for a cancel. */
const CHECK_EVERY_MS = 500;

/**
 * Claims the run, loads the trajectory from the object store, runs the
 * engine stage by stage and stores the report. Every change of the run's
 * state goes through services/analysis-runs.ts, and every one of them
 * holds only while this attempt's claim does.
 */
export async function analyseJob(job: SandboxedJob, ctx: AppContext, attempt: JobAttempt): Promise<unknown> {
  const { runId } = job.data as AnalyseJobData;
  const claim = `${job.id}:${attempt.token}`;
  const run = await claimRun(ctx, runId, claim);
  if (!run) return { skipped: 'the run is no longer waiting to run' };

  let lastCheck = 0;
  const checkpoint = async (percent: number, force = false) => {
    if (releaseRequested(attempt)) throw new AttemptReleased();
    const now = Date.now();
    if (!force && now - lastCheck < CHECK_EVERY_MS) return;
    lastCheck = now;
    await job.updateProgress(Math.round(percent));
    await recordProgress(ctx, runId, claim, percent);
  };

  let curvesKey: string | null = null;
  try {
    const trajectory = await getTrajectoryRow(ctx, run.trajectoryId);
    // Inspection fills the time step in whenever the file states times, so a gap here means nobody has said it yet.
    if (!trajectory.timeStep) {
      throw new UnrecoverableError(`${trajectory.name} states no time between frames: set "Time between frames" in the trajectory's metadata, then start the analysis again.`);
    }
    const params = analysisParamsSchema.parse(run.params);
    const selection = selectFrames(trajectory.frames ?? 0, trajectoryFacts(trajectory).framePs, params);
    if ('problem' in selection) throw new UnrecoverableError(selection.problem);
    const stages = STAGES.map((s) => s.filter((k) => run.analyses.includes(k))).filter((s) => s.length > 0);
    if (stages.length === 0) throw new UnrecoverableError('No analysis was selected.');
    const facts = { statedTemperatureK: trajectory.temperatureK, constraints: trajectory.constraints };
    // Coordinates beyond the memory budget wait in a scratch file for the engine, removed once it is done
    // (inside the job's own temp folder, so even a job whose process dies leaves nothing for long).
    const coordinateBytes = selection.frames * (trajectory.atoms ?? 0) * 12 * (trajectory.hasVelocities ? 2 : 1);
    const result = await withScratch(ctx.config.ANALYSIS_IN_MEMORY_BYTES, async (spill) => {
      const traj = await loadTrajectory(ctx, trajectory, selection, (f) => checkpoint(LOAD_SHARE * f), spill, attempt.tempDir);
      // The engine runs in its own thread; this one checks for a cancel or a
      // shutdown every half second of its work and ends it on the spot.
      return runInEngineThread({ trajectory: traj, stages, params, facts }, {
        checkEveryMs: CHECK_EVERY_MS,
        signal: attempt.signal,
        check: (f) => checkpoint(LOAD_SHARE + (100 - LOAD_SHARE - 5) * f, true),
      });
    }, attempt.tempDir, coordinateBytes);
    await checkpoint(96, true);
    curvesKey = curvesKeyFor(trajectory.objectKey, runId);
    await ctx.store.putBytes(curvesKey, encodeCurves(result.curves), 'application/gzip');
    const reportId = await completeRun(ctx, run, claim, {
      title: reportTitle(trajectory.name, stages.flat(), result.methods.params),
      analyses: stages.flat(), params: result.methods.params as unknown as Record<string, unknown>,
      summary: result.summary as Record<string, unknown>,
      methods: { ...result.methods, caution: result.caution, input: inputDescription(trajectory), frames: framesDescription(selection, params.discardPs) } as Record<string, unknown>,
      curvesKey, engineVersion: result.engineVersion, inputSha256: trajectory.sha256,
    });
    if (reportId === null) throw await runLostReason(ctx, runId);
    return { reportId };
  } catch (err) {
    if (curvesKey) await discard(ctx, curvesKey);
    return settleFailure(err, { job, ctx, runId, claim, attempt });
  }
}

async function discard(ctx: AppContext, key: string): Promise<void> {
  await ctx.store.delete(key).catch((err: Error) => ctx.log.warn({ key, err: err.message }, 'could not remove the curves of an unfinished run'));
}

interface FailureContext {
  job: SandboxedJob;
  ctx: AppContext;
  runId: number;
  claim: string;
  attempt: JobAttempt;
}

/** What an attempt that did not finish leaves behind: a released, stopped, failed or retried run. */
async function settleFailure(err: unknown, { job, ctx, runId, claim, attempt }: FailureContext): Promise<unknown> {
  if (err instanceof RunLost) return { stopped: err.status };
  if (err instanceof AttemptReleased) {
    // Back to the queue without spending an attempt; another worker takes it from the start.
    if (await releaseRun(ctx, runId, claim)) {
      await job.moveToWait(attempt.token);
      throw new WaitingError();
    }
    return { stopped: 'released' };
  }
  // The engine is deterministic: an error there will not go away on a retry, while a lost connection might.
  const plain = err instanceof EngineFailure || err instanceof TrajectoryFormatError || err instanceof RangeError || err instanceof UnrecoverableError || err instanceof ScratchTooSmall;
  const message = err instanceof Error ? err.message : String(err);
  // A retry will claim the run again; only the last attempt (or a hopeless error) marks it failed.
  if (plain || job.attemptsMade + 1 >= (job.opts.attempts ?? 1)) await failRun(ctx, runId, claim, message);
  throw plain ? new UnrecoverableError(message) : err;
}

function inputDescription(t: TrajectoryRow) {
  return {
    file: t.name, sha256: t.sha256, format: t.format, compression: t.compression, atoms: t.atoms, frames: t.frames,
    timeStep: t.timeStep, timeUnit: t.timeUnit, lengthUnit: t.lengthUnit, velocityUnit: t.velocityUnit,
    boundary: t.boundary, ensemble: t.ensemble, temperatureK: t.temperatureK, constraints: t.constraints, potential: t.potential, engine: t.engine,
  };
}

/** Which frames the engine saw, for the report's methods. */
function framesDescription(s: FrameSelection, discardPs: number) {
  return { from: s.from, to: s.to, stride: s.stride, used: s.frames, discardedFrames: s.discardFrames, discardPs, autoStride: s.autoStride };
}

/** The selected frames in the engine's units, from the binary frame store (no text is parsed) or, for older uploads, the file. */
async function loadTrajectory(ctx: AppContext, row: TrajectoryRow, selection: FrameSelection, progress: (fraction: number) => Promise<void>, spill: AssembleSpill, tempDir?: string) {
  let seen = 0;
  async function* counted(): AsyncGenerator<Frame> {
    for await (const frame of storedFrames(ctx, row, { from: selection.from, to: selection.to, stride: selection.stride }, tempDir)) {
      // Every frame: the checkpoint itself writes at most every CHECK_EVERY_MS, and a frame of a large
      // system (or of an old upload read from its text) can take long enough that a cancel must not wait for 50.
      await progress(++seen / selection.frames);
      yield frame;
    }
  }
  const framePs = row.timeStep ? row.timeStep * (TIME_TO_PS[row.timeUnit as TimeUnit] ?? 1) : undefined;
  return assembleTrajectory(counted(), {
    length: row.lengthUnit as LengthUnit, time: row.timeUnit as TimeUnit, velocity: row.velocityUnit as VelocityUnit,
    // Without times in the file, frames are the stated interval apart, times the stride.
    timeStepPs: framePs === undefined ? undefined : framePs * selection.stride, boundary: row.boundary,
  }, row.atoms ? { atoms: row.atoms, frames: selection.frames } : undefined, row.name, spill);
}
