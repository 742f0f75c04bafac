import { spawn, type ChildProcess } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { configToEnv, type Config } from '../config.ts';
import type { Logger } from '../logger.ts';
import { prebuiltPath } from '../prebuilt/load.mjs';

export interface SupervisedWorker {
  /** The running child's process id (null between a crash and its restart). */
  pid(): number | null;
  /** Asks the worker to stop as `npm run worker` would on SIGTERM, and waits for it. */
  stop(): Promise<void>;
}

const root = fileURLToPath(new URL('../..', import.meta.url));
const entry = fileURLToPath(new URL('./worker-main.ts', import.meta.url));
/** Keeps h5wasm away from the TypeScript loader when the worker runs from source (see plain-packages-hooks.mjs). */
const plainPackages = fileURLToPath(new URL('../prebuilt/plain-packages.mjs', import.meta.url));
const FIRST_RESTART_MS = 1000;
const LONGEST_RESTART_MS = 30_000;
/** A worker that ran this long before dying starts again without delay growth. */
const HEALTHY_RUN_MS = 60_000;

/**
 * The environment of a worker child: the web server's own, with every
 * setting replaced by the resolved configuration, so the child resolves
 * exactly the same settings (and none the parent did not use).
 */
function childEnv(config: Config): NodeJS.ProcessEnv {
  const env: NodeJS.ProcessEnv = { ...process.env };
  for (const key of Object.keys(config)) delete env[key];
  return { ...env, ...configToEnv(config) };
}

/**
 * Runs the job worker as a child process of the web server, so a crash or
 * an out-of-memory in a job ends that process, never the API. A child that
 * dies is started again, with a growing pause if it keeps dying.
 */
export function superviseWorkerProcess(config: Config, log: Logger): SupervisedWorker {
  let child: ChildProcess | null = null;
  let stopping = false;
  let pause = FIRST_RESTART_MS;
  let restartTimer: NodeJS.Timeout | undefined;

  const start = () => {
    const startedAt = Date.now();
    // The prebuilt bundle starts in a fraction of the loader's time; a changed source falls back to the loader.
    const bundle = prebuiltPath('worker-main');
    const proc = spawn(process.execPath, bundle ? [bundle] : ['--import', 'tsx', '--import', plainPackages, entry], {
      cwd: root, env: childEnv(config), stdio: ['ignore', 'inherit', 'inherit', 'ipc'],
    });
    child = proc;
    log.info({ pid: proc.pid }, 'job worker process started');
    proc.once('exit', (code, signal) => {
      if (child === proc) child = null;
      if (stopping) return;
      if (Date.now() - startedAt > HEALTHY_RUN_MS) pause = FIRST_RESTART_MS;
      log.error({ code, signal, restartInMs: pause }, 'job worker process ended unexpectedly; starting another');
      restartTimer = setTimeout(start, pause);
      pause = Math.min(LONGEST_RESTART_MS, pause * 2);
    });
  };
  start();

  return {
    pid: () => child?.pid ?? null,
    async stop() {
      stopping = true;
      clearTimeout(restartTimer);
      const proc = child;
      if (!proc || proc.exitCode !== null || proc.signalCode !== null) return;
      const exited = new Promise<void>((resolve) => proc.once('exit', () => resolve()));
      proc.kill('SIGTERM');
      // The worker gives running jobs the grace period, then hands them back; past that it is stuck.
      const hardStop = setTimeout(() => proc.kill('SIGKILL'), config.WORKER_SHUTDOWN_GRACE_MS + 20_000);
      await exited;
      clearTimeout(hardStop);
    },
  };
}
