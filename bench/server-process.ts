import { spawn } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { stopPid } from '../scripts/services/process-handle.ts';
import { freePort, waitForPort } from '../scripts/services/wait-for-port.ts';

/** A server started as `npm run serve` starts it: its own process (and its worker's), on a free loopback port. */
export interface ServerProcess {
  url: string;
  pid: number;
  stop(): Promise<void>;
}

const root = fileURLToPath(new URL('..', import.meta.url));

/**
 * Starts server/main.ts in a child process with the given environment and
 * waits until it accepts connections; stop() sends SIGTERM to that process
 * (which stops its own worker) and waits for it to go.
 */
export async function startServerProcess(env: Record<string, string>, nodeArgs: string[] = [], timeoutMs = 120_000): Promise<ServerProcess> {
  const port = await freePort();
  const child = spawn(process.execPath, [...nodeArgs, '--import', 'tsx', '--import', './server/prebuilt/plain-packages.mjs', 'server/main.ts'], {
    cwd: root, stdio: ['ignore', 'inherit', 'inherit'],
    env: { ...process.env, ...env, PORT: String(port), HOST: '127.0.0.1' },
  });
  const pid = child.pid;
  if (pid === undefined) throw new Error('the server process did not start');
  const exited = new Promise<never>((_, reject) => child.once('exit', (code) => reject(new Error(`the server process exited with code ${code} before it listened`))));
  try {
    await Promise.race([waitForPort(port, timeoutMs, 'the server process'), exited]);
  } catch (err) {
    await stopPid(pid);
    throw err;
  }
  exited.catch(() => {});
  return { url: `http://127.0.0.1:${port}`, pid, stop: () => stopPid(pid) };
}
