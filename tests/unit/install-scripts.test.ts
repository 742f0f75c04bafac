import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';

const root = new URL('../../', import.meta.url);
const pkg = JSON.parse(readFileSync(new URL('package.json', root), 'utf8')) as { allowScripts?: Record<string, boolean> };
const lock = JSON.parse(readFileSync(new URL('package-lock.json', root), 'utf8')) as { packages: Record<string, { hasInstallScript?: boolean }> };

describe('install scripts of dependencies (npm allowScripts)', () => {
  it('when a locked package has an install script, then package.json decides it, so a fresh install is quiet', () => {
    const withScripts = [...new Set(Object.entries(lock.packages).filter(([, p]) => p.hasInstallScript).map(([path]) => path.split('node_modules/').at(-1)!))];
    const undecided = withScripts.filter((name) => pkg.allowScripts?.[name] === undefined);
    expect(undecided).toEqual([]);
  });

  it('when a package ships its binary in an optional platform package, then its script stays denied: nothing is fetched or built at install', () => {
    for (const name of ['esbuild', '@parcel/watcher', 'lmdb', 'msgpackr-extract']) expect(pkg.allowScripts?.[name], name).toBe(false);
  });
});
