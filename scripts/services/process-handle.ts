import { existsSync, readFileSync } from 'node:fs';

/** A service this project started, stopped by its own process id. */
export interface ServiceHandle {
  name: string;
  stop(): Promise<void>;
}

export function isAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

export function readPid(pidFile: string): number | null {
  if (!existsSync(pidFile)) return null;
  const pid = Number(readFileSync(pidFile, 'utf8').trim());
  return Number.isInteger(pid) && pid > 0 ? pid : null;
}

/** Sends SIGTERM, waits for the process to go, then SIGKILL as a last resort. */
export async function stopPid(pid: number, timeoutMs = 15_000): Promise<void> {
  if (!isAlive(pid)) return;
  process.kill(pid, 'SIGTERM');
  const deadline = Date.now() + timeoutMs;
  while (isAlive(pid) && Date.now() < deadline) await new Promise((r) => setTimeout(r, 100));
  if (isAlive(pid)) process.kill(pid, 'SIGKILL');
}
