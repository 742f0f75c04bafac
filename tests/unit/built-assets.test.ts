import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const dist = join(process.cwd(), 'dist/ergodic/browser');

function filesUnder(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) =>
    e.isDirectory() ? filesUnder(join(dir, e.name)) : [join(dir, e.name)]);
}

// `npm test` builds the app before the browser suite; run alone before a build, this says so and skips.
describe.skipIf(!existsSync(join(dist, 'index.html')))('the built web app', () => {
  it('when its HTML, CSS and scripts are searched, then they load nothing from an outside host', () => {
    const offenders: string[] = [];
    for (const file of filesUnder(dist).filter((f) => /\.(html|css|js)$/.test(f))) {
      const text = readFileSync(file, 'utf8');
      // url(...) and src/href attributes are how a page pulls in remote fonts, styles and scripts.
      for (const m of text.matchAll(/(?:url\(\s*["']?|(?:src|href)\s*=\s*["'])(https?:)?\/\/([^"')\s]+)/g)) {
        offenders.push(`${file}: ${m[0]}`);
      }
      for (const m of text.matchAll(/@import\s+["']?(?:url\()?["']?https?:\/\/[^"')\s]+/g)) offenders.push(`${file}: ${m[0]}`);
    }
    expect(offenders).toEqual([]);
  });
});
