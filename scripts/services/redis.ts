import { spawn } from 'node:child_process';
import { mkdirSync, openSync } from 'node:fs';
import { join } from 'node:path';
import { ensureDebianPackages } from './debian-package.ts';
import { isAlive, readPid, stopPid, type ServiceHandle } from './process-handle.ts';
import { assertPortFree, waitForPort } from './wait-for-port.ts';

export interface RedisOptions {
  dataDir: string;
  port: number;
  /** Keep queued jobs across restarts (npm start); tests run without. */
  persistent: boolean;
  log?: (m: string) => void;
}

/** Starts a private Redis for the job queue on 127.0.0.1:port. */
export async function startRedis(options: RedisOptions): Promise<ServiceHandle> {
  const log = options.log ?? (() => {});
  ensureDebianPackages('/usr/bin/redis-server', ['redis-server'], log);
  mkdirSync(options.dataDir, { recursive: true });
  const pidFile = join(options.dataDir, 'redis.pid');
  const stale = readPid(pidFile);
  if (stale && isAlive(stale)) await stopPid(stale);

  const args = [
    '--port', String(options.port), '--bind', '127.0.0.1', '--protected-mode', 'yes',
    '--dir', options.dataDir, '--pidfile', pidFile, '--daemonize', 'no',
    '--save', '', '--appendonly', options.persistent ? 'yes' : 'no',
    // BullMQ requires that Redis never evicts its keys.
    '--maxmemory-policy', 'noeviction',
  ];
  await assertPortFree(options.port, 'Redis', 'ERGODIC_REDIS_PORT');
  const out = openSync(join(options.dataDir, 'redis.log'), 'a');
  const child = spawn('/usr/bin/redis-server', args, { stdio: ['ignore', out, out] });
  await waitForPort(options.port, 30_000, 'Redis');
  log(`Redis ready on 127.0.0.1:${options.port}`);
  return {
    name: 'Redis',
    async stop() {
      if (child.pid) await stopPid(child.pid);
    },
  };
}
