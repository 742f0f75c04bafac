import { UnrecoverableError, type SandboxedJob } from 'bullmq';
import { and, eq } from 'drizzle-orm';
import { analysisParamsSchema, type AnalysisKey } from '../../../shared/analysis-params.ts';
import { runAnalyses, type AnalysisRun } from '../../analysis/index.ts';
import type { AppContext } from '../../context.ts';
import { analysisRuns, reports, type TrajectoryRow } from '../../db/schema/index.ts';
import { TrajectoryFormatError, type Frame } from '../../formats/frame.ts';
import { assembleTrajectory } from '../../formats/assemble.ts';
import { openTrajectory } from '../../formats/open-trajectory.ts';
import { TIME_TO_PS, type LengthUnit, type TimeUnit, type VelocityUnit } from '../../formats/units.ts';
import { getRunRow } from '../../services/analysis-runs.ts';
import { readerLimits } from '../../services/reader-limits.ts';
import { encodeCurves } from '../../services/report-curves.ts';
import { discardIfDeleted, getTrajectoryRow } from '../../services/trajectories.ts';
import { curvesKeyFor } from '../../storage/object-keys.ts';
import type { AnalyseJobData } from '../queue.ts';

/** Analyses that share an intermediate run together: VDOS needs the VACF, S(q) needs g(r). */
const STAGES: AnalysisKey[][] = [['thermo'], ['msd'], ['vacf', 'vdos'], ['rdf', 'sq'], ['lindemann'], ['ngp'], ['energy']];
const LOAD_SHARE = 25;

class Cancelled extends Error {}

/**
 * Loads the trajectory from the object store, runs the engine stage by stage,
 * mirrors progress to the run's row (the record the UI reads), and stores
 * the report: summary in MariaDB, curves as gzip JSON in the object store.
 */
export async function analyseJob(job: SandboxedJob, ctx: AppContext): Promise<unknown> {
  const { runId } = job.data as AnalyseJobData;
  const run = await getRunRow(ctx, runId).catch(() => null);
  if (!run || run.status === 'cancelled') return { skipped: run ? 'cancelled' : 'deleted' };
  await ctx.db.update(analysisRuns).set({ status: 'running', progress: 0, startedAt: new Date(), attempts: job.attemptsMade + 1, error: null })
    .where(eq(analysisRuns.id, runId));

  let lastWrite = 0;
  const report = async (percent: number, force = false) => {
    const now = Date.now();
    if (!force && now - lastWrite < 400) return;
    lastWrite = now;
    const p = Math.max(0, Math.min(100, Math.round(percent)));
    await job.updateProgress(p);
    const [row] = await ctx.db.select({ status: analysisRuns.status }).from(analysisRuns).where(eq(analysisRuns.id, runId));
    if (!row || row.status === 'cancelled') throw new Cancelled();
    await ctx.db.update(analysisRuns).set({ progress: p }).where(eq(analysisRuns.id, runId));
  };

  // The engine is deterministic: an error there will not go away on a retry,
  // while a lost connection to the store or database might.
  let inEngine = false;
  try {
    const trajectory = await getTrajectoryRow(ctx, run.trajectoryId);
    // Inspection fills the time step in whenever the file states times, so a gap here means nobody has said it yet.
    if (!trajectory.timeStep) {
      throw new UnrecoverableError(`${trajectory.name} states no time between frames: set "Time between frames" in the trajectory's metadata, then start the analysis again.`);
    }
    const traj = await loadTrajectory(ctx, trajectory, (f) => report(LOAD_SHARE * f));
    const params = analysisParamsSchema.parse(run.params);
    const stages = STAGES.map((s) => s.filter((k) => run.analyses.includes(k))).filter((s) => s.length > 0);
    let result: AnalysisRun | null = null;
    for (const [i, stage] of stages.entries()) {
      await report(LOAD_SHARE + ((100 - LOAD_SHARE - 5) * i) / stages.length, true);
      inEngine = true;
      const part = runAnalyses(traj, stage, params, (f) => {
        // The engine is synchronous; progress is sent without waiting and the
        // cancellation check happens between stages.
        void job.updateProgress(Math.round(LOAD_SHARE + ((100 - LOAD_SHARE - 5) * (i + f)) / stages.length));
      });
      inEngine = false;
      result = result ? merge(result, part) : part;
    }
    if (!result) throw new UnrecoverableError('No analysis was selected.');
    await report(96, true);
    const curvesKey = curvesKeyFor(trajectory.objectKey, runId);
    await ctx.store.putBytes(curvesKey, encodeCurves(result.curves), 'application/gzip');
    // The trajectory may have been deleted while the engine ran: then its folder, curves included, goes.
    if (await discardIfDeleted(ctx, run.trajectoryId, trajectory.objectKey)) return { skipped: 'trajectory deleted' };
    const [{ id: reportId }] = await ctx.db.insert(reports).values({
      runId, projectId: run.projectId, trajectoryId: run.trajectoryId,
      title: `${trajectory.name}: ${stages.flat().map(labelOf).join(', ')}`,
      analyses: stages.flat(), params: result.methods.params as unknown as Record<string, unknown>,
      summary: result.summary as Record<string, unknown>,
      methods: { ...result.methods, caution: result.caution, input: inputDescription(trajectory) } as Record<string, unknown>,
      curvesKey, engineVersion: result.engineVersion, inputSha256: trajectory.sha256,
    }).$returningId();
    // Only a run still marked running becomes done: a cancel that landed meanwhile wins.
    await ctx.db.update(analysisRuns).set({ status: 'done', progress: 100, reportId, finishedAt: new Date() })
      .where(and(eq(analysisRuns.id, runId), eq(analysisRuns.status, 'running')));
    return { reportId };
  } catch (err) {
    if (err instanceof Cancelled) return { cancelled: true };
    const plain = inEngine || err instanceof TrajectoryFormatError || err instanceof RangeError || err instanceof UnrecoverableError;
    const message = err instanceof Error ? err.message : String(err);
    if (plain || job.attemptsMade + 1 >= (job.opts.attempts ?? 1)) {
      await ctx.db.update(analysisRuns).set({ status: 'failed', error: message, finishedAt: new Date() }).where(eq(analysisRuns.id, runId));
    }
    throw plain ? new UnrecoverableError(message) : err;
  }
}

function labelOf(key: AnalysisKey): string {
  return { thermo: 'temperature', msd: 'MSD', vacf: 'VACF', vdos: 'VDOS', rdf: 'g(r)', sq: 'S(q)', lindemann: 'Lindemann', ngp: 'α₂', energy: 'energy' }[key];
}

function merge(a: AnalysisRun, b: AnalysisRun): AnalysisRun {
  return {
    ...a,
    summary: { ...a.summary, ...b.summary },
    curves: { ...a.curves, ...b.curves },
    methods: { ...a.methods, ...b.methods },
  };
}

function inputDescription(t: TrajectoryRow) {
  return {
    file: t.name, sha256: t.sha256, format: t.format, compression: t.compression, atoms: t.atoms, frames: t.frames,
    timeStep: t.timeStep, timeUnit: t.timeUnit, lengthUnit: t.lengthUnit, velocityUnit: t.velocityUnit,
    boundary: t.boundary, ensemble: t.ensemble, temperatureK: t.temperatureK, potential: t.potential, engine: t.engine,
  };
}

async function loadTrajectory(ctx: AppContext, row: TrajectoryRow, progress: (fraction: number) => Promise<void>) {
  const stream = await ctx.store.getStream(row.objectKey);
  const opened = await openTrajectory(stream, row.name, { ...readerLimits(ctx.config), totalBytes: row.sizeBytes });
  const total = Math.max(1, row.frames ?? 1);
  async function* counted(): AsyncGenerator<Frame> {
    for await (const frame of opened.frames) {
      if (frame.index % 50 === 0) await progress(frame.index / total);
      yield frame;
    }
  }
  const timeStepPs = row.timeStep ? row.timeStep * (TIME_TO_PS[row.timeUnit as TimeUnit] ?? 1) : undefined;
  return assembleTrajectory(counted(), {
    length: row.lengthUnit as LengthUnit, time: row.timeUnit as TimeUnit, velocity: row.velocityUnit as VelocityUnit,
    timeStepPs, boundary: row.boundary,
  }, row.atoms && row.frames ? { atoms: row.atoms, frames: row.frames } : undefined, row.name);
}
