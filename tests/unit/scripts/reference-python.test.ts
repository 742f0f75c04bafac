import { chmodSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { findReferencePython, referencePythonCandidates, REFERENCE_PYTHON_ENV } from '../../../scripts/services/reference-python.ts';

const dir = mkdtempSync(join(tmpdir(), 'ergodic-python-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** A stand-in interpreter that succeeds or fails whatever it is asked to import. */
function fakeInterpreter(name: string, importsWork: boolean): string {
  const path = join(dir, name);
  writeFileSync(path, `#!/bin/sh\nexit ${importsWork ? 0 : 1}\n`);
  chmodSync(path, 0o755);
  return path;
}

describe('the interpreter for the numpy/scipy cross-check', () => {
  it('when the first interpreter lacks numpy (a version-manager shim), then the next one that imports numpy and scipy is used', () => {
    const shim = fakeInterpreter('shim-python3', false);
    const debian = fakeInterpreter('debian-python3', true);
    expect(findReferencePython([shim, join(dir, 'absent'), debian])).toBe(debian);
  });

  it('when no interpreter imports them, then there is none', () => {
    expect(findReferencePython([fakeInterpreter('bare-python3', false), join(dir, 'absent')])).toBeNull();
  });

  it('when npm test names an interpreter, then it is tried first, before Debian’s /usr/bin/python3 and PATH', () => {
    expect(referencePythonCandidates({ [REFERENCE_PYTHON_ENV]: '/opt/py/bin/python3' })).toEqual(['/opt/py/bin/python3', '/usr/bin/python3', 'python3']);
    expect(referencePythonCandidates({})).toEqual(['/usr/bin/python3', 'python3']);
  });
});
