// Registered after the TypeScript loader (`--import tsx --import
// ./server/prebuilt/plain-packages.mjs`, or by load.mjs in a thread), so
// its hooks run first and keep the packages they name away from it.
import { register } from 'node:module';

register('./plain-packages-hooks.mjs', import.meta.url);
