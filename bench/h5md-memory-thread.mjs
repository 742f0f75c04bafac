// A job thread from source: the TypeScript loader registered as load.mjs
// does it, with or without the hooks that keep h5wasm away from it.
import { workerData } from 'node:worker_threads';

const { register } = await import('tsx/esm/api');
register();
if (workerData.guard) await import('../server/prebuilt/plain-packages.mjs');
await import('./h5md-memory.ts');
