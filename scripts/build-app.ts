import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync, statSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';

function newestMtime(dir: string): number {
  let newest = 0;
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const path = join(dir, entry.name);
    newest = Math.max(newest, entry.isDirectory() ? newestMtime(path) : statSync(path).mtimeMs);
  }
  return newest;
}

/** Builds the Angular app when there is no build yet or the sources are newer than it. */
export function buildAppIfNeeded(root: string, log: (m: string) => void): void {
  // The build leaves a stamp; a build newer than every source is reused.
  const stamp = join(root, 'dist/ergodic/.built');
  const inputs = ['src', 'shared'].map((d) => join(root, d)).concat(join(root, 'angular.json'));
  const newestInput = () => Math.max(...inputs.map((p) => (statSync(p).isDirectory() ? newestMtime(p) : statSync(p).mtimeMs)));
  if (existsSync(stamp) && newestInput() <= statSync(stamp).mtimeMs) return;
  log('building the web app (about a minute the first time)…');
  const result = spawnSync('npx', ['ng', 'build'], { cwd: root, stdio: 'inherit', env: { ...process.env, NG_CLI_ANALYTICS: 'false' } });
  if (result.status !== 0) throw new Error('the web app build failed (see above)');
  writeFileSync(stamp, new Date().toISOString());
}
