import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, rmSync, writeFileSync } from 'node:fs';

let aptUpdated = false;

/** True when `binary` is an executable path or found on PATH. */
export function hasBinary(binary: string): boolean {
  if (binary.startsWith('/')) return existsSync(binary);
  return spawnSync('sh', ['-c', `command -v ${binary}`], { stdio: 'ignore' }).status === 0;
}

/** True when this process may install Debian packages itself (root, with apt-get). */
export function canInstallDebianPackages(): boolean {
  return process.getuid?.() === 0 && hasBinary('apt-get');
}

/**
 * Installs Debian packages when `binary` is missing. The project promises a
 * two-command set-up on a fresh machine, so the services it needs come from
 * Debian's own archive rather than a download of our choosing.
 */
export function ensureDebianPackages(binary: string, packages: string[], log: (m: string) => void): void {
  ensureDebianPackagesFor(binary, () => hasBinary(binary), packages, log);
}

/**
 * Installs Debian packages unless `present()` already holds; `what` names the
 * missing thing in messages. Throws when it still does not hold afterwards.
 */
export function ensureDebianPackagesFor(what: string, present: () => boolean, packages: string[], log: (m: string) => void): void {
  if (present()) return;
  if (!canInstallDebianPackages()) {
    throw new Error(`${what} is missing; install it with: sudo apt-get install -y ${packages.join(' ')}`);
  }
  log(`installing ${packages.join(', ')} from Debian's packages (${what} is missing)…`);
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  if (!aptUpdated) {
    execFileSync('apt-get', ['update', '-qq'], { stdio: 'inherit', env });
    aptUpdated = true;
  }
  // Debian's maintainer scripts would otherwise start a system-wide copy of
  // the service on its default port; we only want our private instance.
  const policy = '/usr/sbin/policy-rc.d';
  const wrotePolicy = !existsSync(policy);
  if (wrotePolicy) writeFileSync(policy, '#!/bin/sh\nexit 101\n', { mode: 0o755 });
  try {
    execFileSync('apt-get', ['install', '-y', '-qq', '--no-install-recommends', ...packages], { stdio: 'inherit', env });
  } finally {
    if (wrotePolicy) rmSync(policy, { force: true });
  }
  if (!present()) throw new Error(`${what} still missing after installing ${packages.join(' ')}`);
}
