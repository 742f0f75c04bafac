import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { freePort } from '../../scripts/services/wait-for-port.ts';
import { pollUntil } from '../support/poll.ts';

/**
 * `npm start` stopped by SIGTERM at different moments of its life: every
 * process it started (MariaDB, Redis, the server's worker, helpers) must be
 * gone when it has exited, and it exits 0. The S3 and SMTP fakes run inside
 * the orchestrator itself, so their ports must be free again too.
 */

interface SeenProcess { pid: number; name: string }

/** Parent of every process now running, from /proc. */
function parents(): Map<number, { ppid: number; name: string }> {
  const out = new Map<number, { ppid: number; name: string }>();
  for (const entry of readdirSync('/proc')) {
    if (!/^\d+$/.test(entry)) continue;
    try {
      const stat = readFileSync(`/proc/${entry}/stat`, 'utf8');
      // "pid (comm) state ppid …"; comm may hold spaces and parentheses, so split after its last ')'.
      const close = stat.lastIndexOf(')');
      const name = stat.slice(stat.indexOf('(') + 1, close);
      const ppid = Number(stat.slice(close + 2).split(' ')[1]);
      out.set(Number(entry), { ppid, name });
    } catch {
      // The process ended while being read.
    }
  }
  return out;
}

function descendantsOf(root: number): SeenProcess[] {
  const table = parents();
  const found: SeenProcess[] = [];
  const queue = [root];
  while (queue.length) {
    const parent = queue.shift()!;
    for (const [pid, { ppid, name }] of table) {
      if (ppid === parent) {
        found.push({ pid, name });
        queue.push(pid);
      }
    }
  }
  return found;
}

function alive(pid: number): boolean {
  try {
    const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
    // A zombie still has an entry but has stopped: it counts as gone.
    return !stat.slice(stat.lastIndexOf(')') + 2).startsWith('Z');
  } catch {
    return false;
  }
}

interface Orchestrator {
  process: ChildProcess;
  ports: number[];
  output: () => string;
  /** Every descendant seen while it ran, by pid. */
  seen: Map<number, string>;
  exited: Promise<number | null>;
}

async function startOrchestrator(dataDir: string): Promise<Orchestrator> {
  const [web, db, redis, s3, smtp] = await Promise.all(Array.from({ length: 5 }, () => freePort()));
  let output = '';
  const child = spawn(process.execPath, ['--import', 'tsx', 'scripts/start.ts'], {
    env: {
      ...process.env, PORT: String(web), ERGODIC_DB_PORT: String(db), ERGODIC_REDIS_PORT: String(redis),
      ERGODIC_S3_PORT: String(s3), ERGODIC_SMTP_PORT: String(smtp), ERGODIC_DATA_DIR: dataDir,
      ERGODIC_BUILD_APP: 'false', ERGODIC_DEMO: 'false', LOG_LEVEL: 'warn',
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  child.stdout!.on('data', (chunk: Buffer) => (output += chunk.toString()));
  child.stderr!.on('data', (chunk: Buffer) => (output += chunk.toString()));
  const seen = new Map<number, string>();
  // Watches the process tree for as long as the orchestrator lives, so short-lived children are seen too.
  const watch = setInterval(() => {
    for (const { pid, name } of descendantsOf(child.pid!)) seen.set(pid, name);
  }, 50);
  const exited = new Promise<number | null>((resolve) => child.once('exit', (code) => {
    clearInterval(watch);
    resolve(code);
  }));
  return { process: child, ports: [web, db, redis, s3, smtp], output: () => output, seen, exited };
}

async function portFree(port: number): Promise<boolean> {
  const { createServer } = await import('node:net');
  return new Promise((resolve) => {
    const probe = createServer().once('error', () => resolve(false)).listen(port, '127.0.0.1', () => probe.close(() => resolve(true)));
  });
}

const folders: string[] = [];
const leftovers: Orchestrator[] = [];
afterAll(async () => {
  for (const o of leftovers) if (o.process.exitCode === null) o.process.kill('SIGKILL');
  for (const o of leftovers) for (const pid of o.seen.keys()) if (alive(pid)) process.kill(pid, 'SIGKILL');
  for (const dir of folders) rmSync(dir, { recursive: true, force: true });
}, 60_000);

/**
 * Starts `npm start` in `dataDir`, sends SIGTERM once its output shows
 * `moment`, and checks that it exits 0 with nothing it started left running.
 */
async function stopAt(dataDir: string, moment: string, expectChildren: RegExp[]): Promise<void> {
  const o = await startOrchestrator(dataDir);
  leftovers.push(o);
  const output = await pollUntil(async () => o.output(), (out) => out.includes(moment) || o.process.exitCode !== null, 240_000, 50);
  expect(output, 'the moment to stop at was never reached').toContain(moment);
  // The children expected by now are up before the signal goes.
  const before = await pollUntil(async () => [...o.seen.values()], (names) => expectChildren.every((re) => names.some((n) => re.test(n))), 30_000, 50);
  for (const re of expectChildren) expect(before.some((n) => re.test(n)), `${re} among ${before.join(', ')}`).toBe(true);
  o.process.kill('SIGTERM');
  const code = await o.exited;
  expect(code, o.output()).toBe(0);
  // The long-lived services are stopped, by pid, before the orchestrator exits.
  const services = [...o.seen].filter(([, name]) => /mariadbd|redis-server|node/.test(name)).filter(([pid]) => alive(pid));
  expect(services, o.output()).toEqual([]);
  // Anything else it started (a helper such as the bundler's service) ends once its parent is gone.
  const remaining = await pollUntil(async () => [...o.seen].filter(([pid]) => alive(pid)), (left) => left.length === 0, 15_000, 100);
  expect(remaining, o.output()).toEqual([]);
  const busy = (await Promise.all(o.ports.map(async (p) => ((await portFree(p)) ? null : p)))).filter((p) => p !== null);
  expect(busy).toEqual([]);
  for (const pidFile of [join(dataDir, 'mariadb', 'mysqld.pid'), join(dataDir, 'redis', 'redis.pid')]) {
    if (!existsSync(pidFile)) continue;
    const pid = Number(readFileSync(pidFile, 'utf8').trim());
    expect(alive(pid), `${pidFile} names ${pid}, still running`).toBe(false);
  }
}

describe('npm start stopped by SIGTERM', () => {
  const dataDir = mkdtempSync(join(tmpdir(), 'ergodic-start-stop-'));
  folders.push(dataDir);

  it('when SIGTERM arrives while MariaDB is first being set up, then start-up stops there and nothing is left running', async () => {
    await stopAt(dataDir, 'initialising MariaDB data', []);
  }, 300_000);

  it('when SIGTERM arrives once MariaDB is ready and Redis is starting, then both are stopped and it exits 0', async () => {
    await stopAt(dataDir, 'MariaDB ready', [/mariadbd/]);
  }, 300_000);

  it('when SIGTERM arrives while the server and its worker are starting, then every service and the worker are stopped', async () => {
    await stopAt(dataDir, 'SMTP fake ready', [/mariadbd/, /redis-server/]);
  }, 300_000);

  it('when SIGTERM arrives after Ergodic is running, then MariaDB, Redis, the fakes, the server and its worker all stop and it exits 0', async () => {
    await stopAt(dataDir, 'Ergodic is running at', [/mariadbd/, /redis-server/, /node/]);
  }, 300_000);
});
