import { fileURLToPath } from 'node:url';
import { join, resolve } from 'node:path';
import { loadConfig } from '../server/config.ts';
import { startServer } from '../server/main.ts';
import { seedDemo } from '../server/demo/seed.ts';
import { buildPrebuilt } from '../server/prebuilt/build.ts';
import { buildAppIfNeeded } from './build-app.ts';
import { startStack } from './services/stack.ts';

/**
 * `npm start`: MariaDB, Redis, the S3 and SMTP fakes, migrations, demo data,
 * the web app build and the server (with its job worker as a child process),
 * all on loopback with data in .data/ (or ERGODIC_DATA_DIR). Ctrl-C stops
 * everything this started; the next start reuses the data. Several
 * instances run side by side given their own ports and data folders.
 */
const root = fileURLToPath(new URL('..', import.meta.url));
const log = (m: string) => console.log(`[ergodic] ${m}`);
const env = process.env;
const port = (name: string, fallback: number) => Number(env[name] ?? fallback);

const dataDir = resolve(root, env['ERGODIC_DATA_DIR'] ?? '.data');

const stack = await startStack({
  dataDir,
  ports: { db: port('ERGODIC_DB_PORT', 3317), redis: port('ERGODIC_REDIS_PORT', 6389), s3: port('ERGODIC_S3_PORT', 4569), smtp: port('ERGODIC_SMTP_PORT', 2525) },
  persistent: true,
  dbPassword: env['ERGODIC_DB_PASSWORD'] ?? 'ergodic-dev',
  log,
});

let stopping = false;
async function stopEverything(code: number, server?: { stop(): Promise<void> }) {
  if (stopping) return;
  stopping = true;
  log('stopping…');
  try {
    await server?.stop();
  } finally {
    await stack.stop();
    process.exit(code);
  }
}

try {
  // ERGODIC_BUILD_APP=false serves the API alone (and whatever build is already there).
  if (env['ERGODIC_BUILD_APP'] !== 'false') buildAppIfNeeded(root, log);
  await buildPrebuilt({ log });
  const config = loadConfig({ ...env, ...stack.env, STATIC_DIR: join(root, 'dist/ergodic/browser') });
  const server = await startServer(config);
  // ERGODIC_DEMO=false starts without the invented demo lab.
  const demo = env['ERGODIC_DEMO'] === 'false' ? { accounts: [], ready: Promise.resolve() } : await seedDemo(server.ctx, log);
  process.once('SIGINT', () => void stopEverything(0, server));
  process.once('SIGTERM', () => void stopEverything(0, server));
  demo.ready.catch((err: unknown) => log(`demo data incomplete: ${err instanceof Error ? err.message : err}`));
  log(`Ergodic is running at ${server.url}`);
  for (const account of demo.accounts) log(`demo ${account.role}: ${account.email} / ${account.password}`);
  log('press Ctrl-C to stop');
} catch (err) {
  console.error(err instanceof Error ? err.message : err);
  await stopEverything(1);
}
