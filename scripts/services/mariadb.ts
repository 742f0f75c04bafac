import { spawn, execFileSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, openSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { ensureDebianPackages } from './debian-package.ts';
import { isAlive, readPid, stopPid, type ServiceHandle } from './process-handle.ts';
import { assertPortFree, waitForPort } from './wait-for-port.ts';

const MARIADBD = '/usr/sbin/mariadbd';

export interface MariaDbOptions {
  dataDir: string;
  port: number;
  database: string;
  user: string;
  password: string;
  /** Smaller redo log and buffer pool for throw-away test instances. */
  small?: boolean;
  log?: (m: string) => void;
}

/** Unix sockets are limited to ~108 bytes; deep checkouts fall back to /tmp. */
function socketPath(dataDir: string): string {
  const inside = join(dataDir, 'mysqld.sock');
  if (inside.length < 100) return inside;
  return join(tmpdir(), `ergodic-${createHash('sha1').update(dataDir).digest('hex').slice(0, 12)}.sock`);
}

function sql(socket: string, statement: string): void {
  execFileSync('mariadb', ['--no-defaults', '-S', socket, '-uroot', '-e', statement], { stdio: 'pipe' });
}

/**
 * Starts a private MariaDB on 127.0.0.1:port with its data inside `dataDir`,
 * installing Debian's server package first when it is missing.
 */
export async function startMariaDb(options: MariaDbOptions): Promise<ServiceHandle> {
  const log = options.log ?? (() => {});
  ensureDebianPackages(MARIADBD, ['mariadb-server-core', 'mariadb-client-core'], log);
  const { dataDir, port } = options;
  const dbDir = join(dataDir, 'db');
  const pidFile = join(dataDir, 'mysqld.pid');
  const socket = socketPath(dataDir);
  // A private temp folder: two servers initialising at once in a shared /tmp collide on their temporary tables.
  const tmp = join(dataDir, 'tmp');
  mkdirSync(tmp, { recursive: true });

  const stale = readPid(pidFile);
  if (stale && isAlive(stale)) await stopPid(stale);

  if (!existsSync(join(dbDir, 'mysql'))) {
    log(`initialising MariaDB data in ${dbDir}`);
    try {
      execFileSync('mariadb-install-db', [
        '--no-defaults', `--datadir=${dbDir}`, `--tmpdir=${tmp}`, '--user=root',
        '--auth-root-authentication-method=normal', '--skip-test-db',
      ], { stdio: 'pipe' });
    } catch (err) {
      const stderr = (err as { stderr?: Buffer }).stderr?.toString().trim();
      throw new Error(`mariadb-install-db could not initialise ${dbDir}${stderr ? `:\n${stderr}` : ''}`);
    }
  }

  const args = [
    '--no-defaults', `--datadir=${dbDir}`, `--tmpdir=${tmp}`, `--socket=${socket}`, `--port=${port}`,
    '--bind-address=127.0.0.1', '--user=root', `--pid-file=${pidFile}`,
    `--log-error=${join(dataDir, 'mysqld.err')}`, '--skip-name-resolve',
    '--character-set-server=utf8mb4', '--collation-server=utf8mb4_unicode_ci',
    '--max-allowed-packet=64M',
  ];
  if (options.small) args.push('--innodb-log-file-size=8M', '--innodb-buffer-pool-size=32M');
  await assertPortFree(port, 'MariaDB', 'ERGODIC_DB_PORT');
  const out = openSync(join(dataDir, 'mysqld.out'), 'a');
  const child = spawn(MARIADBD, args, { stdio: ['ignore', out, out] });
  await waitForPort(port, 60_000, 'MariaDB');

  const user = options.user.replace(/[^a-z0-9_]/gi, '');
  const database = options.database.replace(/[^a-z0-9_]/gi, '');
  const password = options.password.replace(/'/g, "''");
  sql(socket, [
    `CREATE DATABASE IF NOT EXISTS \`${database}\` CHARACTER SET utf8mb4`,
    `CREATE USER IF NOT EXISTS '${user}'@'127.0.0.1' IDENTIFIED BY '${password}'`,
    `ALTER USER '${user}'@'127.0.0.1' IDENTIFIED BY '${password}'`,
    `GRANT ALL ON \`${database}\`.* TO '${user}'@'127.0.0.1'`,
  ].join('; '));
  log(`MariaDB ready on 127.0.0.1:${port}`);

  return {
    name: 'MariaDB',
    async stop() {
      if (child.pid) await stopPid(child.pid, 30_000);
    },
  };
}
