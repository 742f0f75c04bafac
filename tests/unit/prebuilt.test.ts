import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildPrebuilt, prebuiltCurrent } from '../../server/prebuilt/build.ts';
import { MANIFEST_NAME, PREBUILT_ENTRIES, ROOT, prebuiltPath, readManifest, type Manifest } from '../../server/prebuilt/load.mjs';

let dir: string;

// Bundles leave packages to node_modules, so they must sit inside the checkout.
beforeAll(async () => {
  mkdirSync(join(ROOT, 'dist'), { recursive: true });
  dir = mkdtempSync(join(ROOT, 'dist', 'prebuilt-test-'));
  expect(await buildPrebuilt({ dir, force: true })).toBe(true);
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function withManifest(change: (m: Manifest) => void): string {
  const copy = mkdtempSync(join(ROOT, 'dist', 'prebuilt-test-copy-'));
  const manifest = readManifest(dir)!;
  change(manifest);
  writeFileSync(join(copy, MANIFEST_NAME), JSON.stringify(manifest));
  for (const entry of Object.values(manifest.entries)) writeFileSync(join(copy, entry.output), readFileSync(join(dir, entry.output)));
  return copy;
}

describe('prebuilt bundles for the command line, the worker and its threads', () => {
  it('when built, then every entry has a bundle that lists the sources it was made from, and it is used', () => {
    const manifest = readManifest(dir)!;
    expect(Object.keys(manifest.entries).sort()).toEqual(Object.keys(PREBUILT_ENTRIES).sort());
    expect(Object.keys(manifest.entries.cli!.inputs)).toEqual(expect.arrayContaining(['server/cli/main.ts', 'server/formats/xyz-frames.ts']));
    expect(Object.keys(manifest.entries.cli!.inputs).some((f) => f.includes('node_modules'))).toBe(false);
    expect(prebuiltPath('cli', dir)).toBe(join(dir, 'cli.mjs'));
    expect(prebuiltCurrent(dir)).toBe(true);
  });

  it('when a source changed after the build, then its bundle is not used (the loader runs the source instead)', () => {
    const stale = withManifest((m) => {
      m.entries.processor!.inputs['server/jobs/processor.ts']![1] -= 1000;
    });
    try {
      expect(prebuiltPath('processor', stale)).toBeNull();
      expect(prebuiltPath('cli', stale)).not.toBeNull();
      expect(prebuiltCurrent(stale)).toBe(false);
    } finally {
      rmSync(stale, { recursive: true, force: true });
    }
  });

  it('when the bundles were built for another checkout, then they are not used', () => {
    const moved = withManifest((m) => {
      m.root = '/elsewhere/';
    });
    try {
      expect(prebuiltPath('cli', moved)).toBeNull();
    } finally {
      rmSync(moved, { recursive: true, force: true });
    }
  });

  it('when a bundled module looks for a file beside itself, then it finds it beside its source', () => {
    const processor = readFileSync(join(dir, 'processor.mjs'), 'utf8');
    expect(processor).toContain(JSON.stringify(pathToFileURL(join(ROOT, 'server/jobs/engine-runner.ts')).href));
    expect(processor).not.toMatch(/import\.meta\.url/);
  });

  it('when the command line runs from its bundle, then it answers as from source', () => {
    const viaBundle = spawnSync(process.execPath, ['--input-type=module', '-e',
      `const { main } = await import(${JSON.stringify(pathToFileURL(join(dir, 'cli.mjs')).href)}); process.exitCode = await main(['analyze', '/nonexistent/run.xyz']);`], { encoding: 'utf8' });
    expect(viaBundle.status).toBe(1);
    expect(viaBundle.stderr).toMatch(/ergodic: \/nonexistent\/run\.xyz: no such file/);
  });

  it('when prebuilt bundles are switched off, then none is used', () => {
    const check = spawnSync(process.execPath, ['--input-type=module', '-e',
      `const { prebuiltPath } = await import(${JSON.stringify(pathToFileURL(join(ROOT, 'server/prebuilt/load.mjs')).href)}); console.log(prebuiltPath('cli', ${JSON.stringify(dir)}));`],
    { encoding: 'utf8', env: { ...process.env, ERGODIC_PREBUILT: 'off' } });
    expect(check.stdout.trim()).toBe('null');
  });
});
