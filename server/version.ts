import { readFileSync } from 'node:fs';

const pkg = JSON.parse(readFileSync(new URL('../package.json', import.meta.url), 'utf8')) as { version: string };

/** The app version, from package.json; reports record it as the engine version too. */
export const APP_VERSION: string = pkg.version;
