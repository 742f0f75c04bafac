import { spawn } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { join } from 'node:path';
import { loadConfig } from '../server/config.ts';
import { startServer } from '../server/main.ts';
import { buildAppIfNeeded } from './build-app.ts';
import { buildPrebuilt } from '../server/prebuilt/build.ts';
import { ensureDebianPackages } from './services/debian-package.ts';
import { ensureReferencePython, REFERENCE_PYTHON_ENV } from './services/reference-python.ts';
import { startTestStack } from './services/test-stack.ts';
import { freePort } from './services/wait-for-port.ts';

/**
 * `npm test`: starts a throw-away MariaDB, Redis, S3 fake and SMTP fake,
 * runs vitest (unit + integration) and Playwright against them, stops them,
 * and ends with one line `N passed, N failed`.
 * `npm test -- unit|integration|e2e [files…]` runs one suite.
 */
const root = fileURLToPath(new URL('..', import.meta.url));
const log = (m: string) => console.log(`[test] ${m}`);
const [suiteArg, ...files] = process.argv.slice(2);
const suites = suiteArg && ['unit', 'integration', 'e2e'].includes(suiteArg) ? [suiteArg] : ['unit', 'integration', 'e2e'];
const extraFiles = suiteArg && !suites.includes(suiteArg) ? [suiteArg, ...files] : files;
const results = join(root, 'test-results');
rmSync(results, { recursive: true, force: true });
mkdirSync(results, { recursive: true });

interface Counts { passed: number; failed: number; skipped: number }
const total: Counts = { passed: 0, failed: 0, skipped: 0 };
let crashed = false;

/** Asynchronous on purpose: the server under test shares this process's event loop. */
function run(command: string, args: string[], env: Record<string, string>): Promise<number> {
  return new Promise((resolve) => {
    const child = spawn(command, args, { cwd: root, stdio: 'inherit', env: { ...process.env, ...env } });
    child.once('exit', (code) => resolve(code ?? 1));
    child.once('error', () => resolve(1));
  });
}

function readVitest(file: string): Counts | null {
  if (!existsSync(file)) return null;
  const report = JSON.parse(readFileSync(file, 'utf8')) as { numPassedTests: number; numFailedTests: number; numPendingTests: number; numTodoTests: number };
  return { passed: report.numPassedTests, failed: report.numFailedTests, skipped: report.numPendingTests + report.numTodoTests };
}

function readPlaywright(file: string): Counts | null {
  if (!existsSync(file)) return null;
  const report = JSON.parse(readFileSync(file, 'utf8')) as { stats: { expected: number; unexpected: number; flaky: number; skipped: number } };
  return { passed: report.stats.expected + report.stats.flaky, failed: report.stats.unexpected, skipped: report.stats.skipped };
}

function add(counts: Counts | null, what: string) {
  if (!counts) {
    log(`${what} produced no report`);
    crashed = true;
    return;
  }
  total.passed += counts.passed;
  total.failed += counts.failed;
  total.skipped += counts.skipped;
}

// The build comes first so the unit suite can also check the built assets.
if (suites.includes('e2e')) buildAppIfNeeded(root, log);
// Job threads, engine threads and the command line start from these bundles (or from source if this fails).
await buildPrebuilt({ log });
// The numpy/scipy cross-checks run everywhere: Debian's packages are installed
// when no interpreter has them (the check itself fails if that was possible but
// did not happen, and is skipped only where nothing can be installed).
const referencePython: Record<string, string> = {};
if (suites.includes('unit')) {
  try {
    referencePython[REFERENCE_PYTHON_ENV] = ensureReferencePython(log);
  } catch (err) {
    log(`numpy/scipy cross-check cannot run: ${(err as Error).message}`);
  }
}
const needsStack = suites.some((s) => s !== 'unit');
const stack = needsStack ? await startTestStack(log) : null;
try {
  // Vitest strips types without checking them, so the compiler checks them here, once per configuration.
  if (suites.includes('unit') && extraFiles.length === 0) {
    for (const project of ['tsconfig.server.json', 'tsconfig.spec.json']) {
      const ok = (await run('npx', ['tsc', '-p', project, '--noEmit'], {})) === 0;
      log(`type check of ${project}: ${ok ? 'passed' : 'FAILED'}`);
      add({ passed: ok ? 1 : 0, failed: ok ? 0 : 1, skipped: 0 }, `tsc ${project}`);
    }
  }
  const vitestProjects = suites.filter((s) => s !== 'e2e');
  if (vitestProjects.length) {
    const out = join(results, 'vitest.json');
    const status = await run('npx', ['vitest', 'run', ...vitestProjects.flatMap((p) => ['--project', p]),
      '--reporter=default', '--reporter=json', `--outputFile.json=${out}`, ...extraFiles],
      { ...referencePython, ...(stack ? { ERGODIC_STACK_ENV: JSON.stringify(stack.env) } : {}) });
    add(readVitest(out), 'vitest');
    if (status !== 0 && total.failed === 0) crashed = true;
  }
  if (suites.includes('e2e') && stack) {
    ensureDebianPackages('/usr/bin/chromium', ['chromium'], log);
    const port = await freePort();
    const config = loadConfig({ ...process.env, ...stack.env, PORT: String(port), STATIC_DIR: join(root, 'dist/ergodic/browser') });
    const server = await startServer(config);
    try {
      const out = join(results, 'playwright.json');
      const status = await run('npx', ['playwright', 'test', ...extraFiles], {
        E2E_BASE_URL: server.url, ERGODIC_STACK_ENV: JSON.stringify(stack.env), PLAYWRIGHT_SKIP_BROWSER_DOWNLOAD: '1',
      });
      add(readPlaywright(out), 'playwright');
      if (status !== 0 && total.failed === 0) crashed = true;
    } finally {
      await server.stop();
    }
  }
} catch (err) {
  crashed = true;
  console.error(err);
} finally {
  await stack?.stop();
}
if (crashed) total.failed = Math.max(total.failed, 1);
console.log(`${total.passed} passed, ${total.failed} failed${total.skipped ? `, ${total.skipped} skipped` : ''}`);
process.exit(total.failed > 0 ? 1 : 0);
