import { spawnSync } from 'node:child_process';
import { canInstallDebianPackages, ensureDebianPackagesFor } from './debian-package.ts';

/**
 * The Python interpreter behind the reference-library cross-checks (numpy and
 * scipy as independent implementations of the engine's algorithms).
 *
 * `python3` on PATH may be a version manager's shim without numpy, while
 * Debian's python3-numpy and python3-scipy install into /usr/bin/python3; so
 * the interpreter is the first candidate that can import both, not simply
 * whatever `python3` is.
 */
export const REFERENCE_PYTHON_PACKAGES = ['python3-numpy', 'python3-scipy'];

/** Set by `npm test` to the interpreter it checked, for the suites it starts. */
export const REFERENCE_PYTHON_ENV = 'ERGODIC_REFERENCE_PYTHON';

export function referencePythonCandidates(env: NodeJS.ProcessEnv = process.env): string[] {
  return [env[REFERENCE_PYTHON_ENV], '/usr/bin/python3', 'python3'].filter((c): c is string => !!c);
}

/** True when `interpreter` runs and imports numpy and scipy. */
export function hasNumpyAndScipy(interpreter: string): boolean {
  const probe = spawnSync(interpreter, ['-c', 'import numpy, scipy.integrate, scipy.spatial'], { stdio: 'ignore', timeout: 60_000 });
  return probe.status === 0;
}

/** The first candidate that imports numpy and scipy, or null. */
export function findReferencePython(candidates: readonly string[] = referencePythonCandidates()): string | null {
  return candidates.find(hasNumpyAndScipy) ?? null;
}

/**
 * Finds the interpreter, installing Debian's numpy and scipy first when none
 * has them. Throws when they are missing and cannot be installed here (not
 * root, or no apt-get), saying which command would install them.
 */
export function ensureReferencePython(log: (m: string) => void): string {
  ensureDebianPackagesFor('python3 with numpy and scipy', () => findReferencePython() !== null, REFERENCE_PYTHON_PACKAGES, log);
  return findReferencePython()!;
}

/**
 * What a cross-check should do here: run with this interpreter, fail because
 * the libraries are missing although this machine could install them, or be
 * skipped because it cannot (with the reason).
 */
export type ReferencePythonState =
  | { kind: 'ready'; interpreter: string }
  | { kind: 'installable'; reason: string }
  | { kind: 'unavailable'; reason: string };

export function referencePythonState(): ReferencePythonState {
  const interpreter = findReferencePython();
  if (interpreter) return { kind: 'ready', interpreter };
  const install = `apt-get install -y ${REFERENCE_PYTHON_PACKAGES.join(' ')}`;
  return canInstallDebianPackages()
    ? { kind: 'installable', reason: `no python3 with numpy and scipy among ${referencePythonCandidates().join(', ')}; npm test installs them, or run: ${install}` }
    : { kind: 'unavailable', reason: `no python3 with numpy and scipy, and this user cannot install them (sudo ${install})` };
}
