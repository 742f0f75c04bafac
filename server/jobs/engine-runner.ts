/**
 * Runs the engine in a thread of its own and waits for it without blocking:
 * the caller's checks (a cancel in the database, a worker shutting down)
 * keep running every `checkEveryMs`, and whichever of them throws ends the
 * engine thread at once, wherever it is in its work.
 */
import { Worker } from 'node:worker_threads';
import type { AnalysisRun } from '../analysis/index.ts';
import type { EngineReply, EngineRequest } from './engine-messages.ts';
import { BlockFileReader } from '../out-of-core/block-file.ts';

const entry = new URL('./engine-thread-entry.mjs', import.meta.url);

/** The engine failed on its own terms (bad input, a numerical problem, no memory): retrying will not help. */
export class EngineFailure extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'EngineFailure';
  }
}

export interface EngineWatch {
  /** Called with the engine's progress (0–1) every `checkEveryMs`; throwing stops the engine with that error. */
  check(fraction: number): Promise<void>;
  checkEveryMs: number;
  /** Aborting stops the engine too (its reason is checked at the next `check`). */
  signal?: AbortSignal;
}

function transferables(request: EngineRequest): ArrayBuffer[] {
  const { trajectory: t } = request;
  const arrays = [t.positions, t.velocities, t.cells, t.times, ...Object.values(t.observables ?? {})];
  const buffers = new Set<ArrayBuffer>();
  for (const a of arrays) if (a && a.buffer instanceof ArrayBuffer) buffers.add(a.buffer);
  return [...buffers];
}

/** A trajectory read from a scratch file travels as the file's layout; the engine thread opens it itself. */
function posted(request: EngineRequest): EngineRequest {
  const { blocks, ...trajectory } = request.trajectory;
  if (!blocks) return request;
  if (!(blocks instanceof BlockFileReader)) throw new Error('only coordinates in a scratch file can go to the engine thread');
  return { ...request, trajectory, blockFile: blocks.layout };
}

/**
 * Hands the trajectory over to a new engine thread (its arrays move, they
 * are not copied: the caller must not use them afterwards) and resolves
 * with the result.
 */
export async function runInEngineThread(request: EngineRequest, watch: EngineWatch): Promise<AnalysisRun> {
  const worker = new Worker(entry);
  let fraction = 0;
  let timer: NodeJS.Timeout | undefined;
  let onAbort: (() => void) | undefined;
  try {
    return await new Promise<AnalysisRun>((resolve, reject) => {
      worker.on('message', (reply: EngineReply) => {
        if (reply.kind === 'progress') fraction = reply.fraction;
        else if (reply.kind === 'done') resolve(reply.result);
        else reject(new EngineFailure(reply.message));
      });
      worker.on('error', (err: Error & { code?: string }) => {
        reject(new EngineFailure(err.code === 'ERR_WORKER_OUT_OF_MEMORY'
          ? 'The analysis ran out of memory: analyse fewer frames (a frame range or a stride), fewer analyses at once, or a smaller r_max.'
          : err.message));
      });
      worker.on('exit', (code) => reject(new EngineFailure(`The engine stopped unexpectedly (exit code ${code}).`)));
      const tick = () => {
        watch.check(fraction).then(() => { timer = setTimeout(tick, watch.checkEveryMs); }, reject);
      };
      timer = setTimeout(tick, watch.checkEveryMs);
      onAbort = () => watch.check(fraction).catch(reject);
      watch.signal?.addEventListener('abort', onAbort, { once: true });
      worker.postMessage(posted(request), transferables(request));
    });
  } finally {
    clearTimeout(timer);
    if (onAbort) watch.signal?.removeEventListener('abort', onAbort);
    await worker.terminate();
  }
}
