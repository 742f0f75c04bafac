import { fileURLToPath } from 'node:url';
import { join, resolve } from 'node:path';
import { loadConfig } from '../server/config.ts';
import { startServer } from '../server/main.ts';
import { seedDemo } from '../server/demo/seed.ts';
import { buildPrebuilt } from '../server/prebuilt/build.ts';
import { buildAppIfNeeded } from './build-app.ts';
import { StartAborted, startStack, type RunningStack } from './services/stack.ts';

/**
 * `npm start`: MariaDB, Redis, the S3 and SMTP fakes, migrations, demo data,
 * the web app build and the server (with its job worker as a child process),
 * all on loopback with data in .data/ (or ERGODIC_DATA_DIR). Ctrl-C or
 * SIGTERM, at any moment including start-up, stops everything this started
 * and exits 0; the next start reuses the data. Several instances run side
 * by side given their own ports and data folders.
 */
const root = fileURLToPath(new URL('..', import.meta.url));
const log = (m: string) => console.log(`[ergodic] ${m}`);
const env = process.env;
const port = (name: string, fallback: number) => Number(env[name] ?? fallback);

const dataDir = resolve(root, env['ERGODIC_DATA_DIR'] ?? '.data');

/**
 * Signals are heard from the first moment. During start-up a SIGTERM or
 * Ctrl-C is noted and start-up stops at its next step, stopping whatever
 * had started by then; once everything runs it stops everything at once.
 * A second signal while stopping changes nothing (stopping is under way).
 */
const shutdown = new AbortController();
let running: { stop(): Promise<void> } | null = null;
let stack: RunningStack | null = null;
let started = false;
let stopping = false;

async function stopEverything(code: number) {
  if (stopping) return;
  stopping = true;
  log('stopping…');
  try {
    await running?.stop();
  } catch (err) {
    console.error(`could not stop the server: ${err instanceof Error ? err.message : err}`);
  } finally {
    await stack?.stop();
    process.exit(code);
  }
}

for (const signal of ['SIGINT', 'SIGTERM'] as const) {
  process.on(signal, () => {
    if (shutdown.signal.aborted) return;
    shutdown.abort();
    // Still starting: the start-up below notices at its next step and stops from there.
    if (started) void stopEverything(0);
  });
}

/** Past each step of start-up: a signal that came meanwhile ends start-up here. */
function stopIfAsked(): void {
  if (shutdown.signal.aborted) throw new StartAborted();
}

try {
  stack = await startStack({
    dataDir,
    ports: { db: port('ERGODIC_DB_PORT', 3317), redis: port('ERGODIC_REDIS_PORT', 6389), s3: port('ERGODIC_S3_PORT', 4569), smtp: port('ERGODIC_SMTP_PORT', 2525) },
    persistent: true,
    dbPassword: env['ERGODIC_DB_PASSWORD'] ?? 'ergodic-dev',
    log,
    signal: shutdown.signal,
  });
  stopIfAsked();
  // ERGODIC_BUILD_APP=false serves the API alone (and whatever build is already there).
  if (env['ERGODIC_BUILD_APP'] !== 'false') buildAppIfNeeded(root, log);
  stopIfAsked();
  await buildPrebuilt({ log });
  stopIfAsked();
  const config = loadConfig({ ...env, ...stack.env, STATIC_DIR: join(root, 'dist/ergodic/browser') });
  const server = await startServer(config);
  running = server;
  stopIfAsked();
  // ERGODIC_DEMO=false starts without the invented demo lab.
  const demo = env['ERGODIC_DEMO'] === 'false' ? { accounts: [], ready: Promise.resolve() } : await seedDemo(server.ctx, log);
  stopIfAsked();
  started = true;
  demo.ready.catch((err: unknown) => { if (!stopping) log(`demo data incomplete: ${err instanceof Error ? err.message : err}`); });
  log(`Ergodic is running at ${server.url}`);
  for (const account of demo.accounts) log(`demo ${account.role}: ${account.email} / ${account.password}`);
  log('press Ctrl-C to stop');
} catch (err) {
  if (err instanceof StartAborted) {
    await stopEverything(0);
  } else {
    console.error(err instanceof Error ? err.message : err);
    await stopEverything(1);
  }
}
