/**
 * The engine's own thread inside a job: it runs the analyses on a
 * trajectory handed over from the job's thread and answers with the
 * result. The job's thread stays free meanwhile, so it can notice a cancel
 * or a shutdown at once and end this thread wherever the engine is.
 */
import { parentPort } from 'node:worker_threads';
import { runAnalyses, type AnalysisRun } from '../analysis/index.ts';
import type { EngineReply, EngineRequest } from './engine-messages.ts';
import { BlockFileReader } from '../out-of-core/block-file.ts';

const PROGRESS_EVERY_MS = 200;

function merge(a: AnalysisRun, b: AnalysisRun): AnalysisRun {
  return {
    ...a,
    summary: { ...a.summary, ...b.summary },
    curves: { ...a.curves, ...b.curves },
    methods: { ...a.methods, ...b.methods },
  };
}

function run(request: EngineRequest): AnalysisRun {
  const { stages, params, facts } = request;
  const trajectory = request.blockFile ? { ...request.trajectory, blocks: new BlockFileReader(request.blockFile) } : request.trajectory;
  let result: AnalysisRun | null = null;
  let lastPost = 0;
  stages.forEach((stage, i) => {
    const part = runAnalyses(trajectory, stage, params, (f) => {
      const now = Date.now();
      if (now - lastPost < PROGRESS_EVERY_MS) return;
      lastPost = now;
      parentPort!.postMessage({ kind: 'progress', fraction: (i + Math.min(1, f)) / stages.length } satisfies EngineReply);
    }, facts);
    result = result ? merge(result, part) : part;
  });
  if (!result) throw new Error('No analysis was selected.');
  return result;
}

parentPort!.on('message', (request: EngineRequest) => {
  try {
    parentPort!.postMessage({ kind: 'done', result: run(request) } satisfies EngineReply);
  } catch (err) {
    parentPort!.postMessage({ kind: 'failed', message: err instanceof Error ? err.message : String(err) } satisfies EngineReply);
  }
});
