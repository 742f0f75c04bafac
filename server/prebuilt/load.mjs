// Prebuilt JavaScript for what starts often: the command line, the job
// worker process, its job threads and their engine threads. Each is one
// bundle built from the TypeScript (server/prebuilt/build.ts) and starts
// without the TypeScript loader. A bundle is used only while every source
// it was built from is unchanged (size and modification time as recorded
// at build); otherwise, or with ERGODIC_PREBUILT=off, callers fall back to
// the loader and the sources.
import { existsSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

/** The repository root. */
export const ROOT = fileURLToPath(new URL('../..', import.meta.url));
/** Where bundles and their manifest are written. */
export const PREBUILT_DIR = join(ROOT, 'dist', 'node');
export const MANIFEST_NAME = 'manifest.json';

/** Bundle name → its TypeScript entry, relative to the root. */
export const PREBUILT_ENTRIES = {
  cli: 'server/cli/main.ts',
  'worker-main': 'server/jobs/worker-main.ts',
  processor: 'server/jobs/processor.ts',
  'engine-thread': 'server/jobs/engine-thread.ts',
};

/**
 * @typedef {{ output: string, inputs: Record<string, [number, number]> }} ManifestEntry
 * @typedef {{ root: string, entries: Record<string, ManifestEntry> }} Manifest
 */

/** @param {string} dir @returns {Manifest | null} */
export function readManifest(dir = PREBUILT_DIR) {
  try {
    return JSON.parse(readFileSync(join(dir, MANIFEST_NAME), 'utf8'));
  } catch {
    return null;
  }
}

/** @param {ManifestEntry} entry */
function sourcesUnchanged(entry) {
  for (const [file, [size, mtimeMs]] of Object.entries(entry.inputs)) {
    try {
      const s = statSync(join(ROOT, file));
      if (s.size !== size || s.mtimeMs !== mtimeMs) return false;
    } catch {
      return false;
    }
  }
  return true;
}

/**
 * The absolute path of a bundle that matches its sources, or null.
 * @param {keyof typeof PREBUILT_ENTRIES} name
 * @param {string} [dir]
 * @returns {string | null}
 */
export function prebuiltPath(name, dir = PREBUILT_DIR) {
  if (process.env.ERGODIC_PREBUILT === 'off') return null;
  const manifest = readManifest(dir);
  const entry = manifest?.root === ROOT ? manifest.entries?.[name] : undefined;
  if (!entry) return null;
  const output = join(dir, entry.output);
  return existsSync(output) && sourcesUnchanged(entry) ? output : null;
}

/**
 * The bundle's module when it is current, else the TypeScript source
 * through the loader (registered once per thread).
 * @param {keyof typeof PREBUILT_ENTRIES} name
 * @returns {Promise<any>}
 */
export async function importEntry(name) {
  const bundle = prebuiltPath(name);
  if (bundle) return import(pathToFileURL(bundle).href);
  const { register } = await import('tsx/esm/api');
  register();
  // Registered second so its hooks run first: h5wasm is kept away from the TypeScript loader (about 600 MB otherwise).
  await import('./plain-packages.mjs');
  return import(pathToFileURL(join(ROOT, PREBUILT_ENTRIES[name])).href);
}
