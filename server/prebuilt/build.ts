/**
 * Builds the prebuilt bundles (see load.mjs): each entry with the code of
 * this repository bundled into one ES module and every package left to
 * node_modules, by esbuild, locally, in well under a second. Runs at
 * install (`prepare`), at `npm start`, `npm test` and `npm run bench`, and
 * does nothing while the bundles match their sources. A failed build leaves
 * the old manifest out of date, so everything falls back to the TypeScript
 * loader; it never stops the caller.
 */
import { build, type Plugin } from 'esbuild';
import { mkdirSync, readFileSync, renameSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { basename, join, relative } from 'node:path';
import { pathToFileURL } from 'node:url';
import { MANIFEST_NAME, PREBUILT_DIR, PREBUILT_ENTRIES, ROOT, prebuiltPath, type Manifest, type PrebuiltName } from './load.mjs';

/**
 * Inside a bundle every module keeps its own `import.meta.url`, so files it
 * finds beside itself (the thread entries, package.json, migrations) are
 * found exactly as when it runs from source.
 */
const ownImportMetaUrl: Plugin = {
  name: 'own-import-meta-url',
  setup(b) {
    b.onLoad({ filter: /\.ts$/ }, (args) => {
      const source = readFileSync(args.path, 'utf8');
      const contents = source.replaceAll('import.meta.url', JSON.stringify(pathToFileURL(args.path).href));
      return { contents, loader: 'ts' };
    });
  },
};

const NAMES = Object.keys(PREBUILT_ENTRIES) as PrebuiltName[];

/** True when every bundle matches its sources. */
export function prebuiltCurrent(dir = PREBUILT_DIR): boolean {
  return NAMES.every((name) => prebuiltPath(name, dir) !== null);
}

/** Writes through a temporary name, so a reader never sees half a file. */
function writeAtomically(path: string, contents: string | Uint8Array): void {
  const temporary = `${path}.${process.pid}.tmp`;
  writeFileSync(temporary, contents);
  renameSync(temporary, path);
}

export interface BuildPrebuiltOptions {
  dir?: string;
  /** Build even when the bundles are current. */
  force?: boolean;
  log?: (message: string) => void;
}

/** Builds the bundles when they are missing or out of date; true when current bundles are in place afterwards. */
export async function buildPrebuilt(options: BuildPrebuiltOptions = {}): Promise<boolean> {
  const dir = options.dir ?? PREBUILT_DIR;
  if (!options.force && prebuiltCurrent(dir)) return true;
  const started = performance.now();
  try {
    const result = await build({
      absWorkingDir: ROOT,
      entryPoints: Object.fromEntries(NAMES.map((name) => [name, PREBUILT_ENTRIES[name]])),
      outdir: dir,
      outExtension: { '.js': '.mjs' },
      bundle: true,
      platform: 'node',
      format: 'esm',
      target: 'node20',
      packages: 'external',
      plugins: [ownImportMetaUrl],
      metafile: true,
      write: false,
      logLevel: 'silent',
    });
    mkdirSync(dir, { recursive: true });
    const manifest: Manifest = { root: ROOT, entries: {} };
    for (const file of result.outputFiles) writeAtomically(file.path, file.contents);
    for (const [output, meta] of Object.entries(result.metafile.outputs)) {
      const name = NAMES.find((n) => meta.entryPoint === PREBUILT_ENTRIES[n]);
      if (!name) continue;
      const inputs: Record<string, [number, number]> = {};
      for (const input of Object.keys(meta.inputs)) {
        const s = statSync(join(ROOT, input));
        inputs[relative(ROOT, join(ROOT, input))] = [s.size, s.mtimeMs];
      }
      manifest.entries[name] = { output: basename(output), inputs };
    }
    writeAtomically(join(dir, MANIFEST_NAME), JSON.stringify(manifest));
    options.log?.(`prebuilt ${NAMES.join(', ')} in ${((performance.now() - started) / 1000).toFixed(1)} s`);
    return prebuiltCurrent(dir);
  } catch (err) {
    rmSync(join(dir, MANIFEST_NAME), { force: true });
    options.log?.(`prebuilt bundles not built (${err instanceof Error ? err.message.split('\n')[0] : String(err)}); running from the TypeScript sources`);
    return false;
  }
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  await buildPrebuilt({ force: process.argv.includes('--force'), log: (m) => console.log(`[ergodic] ${m}`) });
}
