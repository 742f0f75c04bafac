// A job thread that asks a local copy cache for one key. It reports when
// it starts downloading ('filling') or starts waiting for another thread's
// download ('waiting'), holds its download until told 'go', then reports
// the bytes it read and its cache's counts.
import { readFile, writeFile } from 'node:fs/promises';
import { parentPort, workerData } from 'node:worker_threads';

const { register } = await import('tsx/esm/api');
register();
const { LocalCopyCache } = await import('../../../server/storage/local-copy-cache.ts');

const { dir, key, content } = workerData;
const cache = new LocalCopyCache(dir, 1024 * 1024);
let go;
const released = new Promise((resolve) => (go = resolve));
parentPort.on('message', (message) => message === 'go' && go());

const watch = setInterval(() => {
  if (cache.stats.joins > 0) {
    clearInterval(watch);
    parentPort.postMessage({ state: 'waiting' });
  }
}, 5);
const copy = await cache.acquire(key, async (path) => {
  clearInterval(watch);
  parentPort.postMessage({ state: 'filling' });
  await released;
  await writeFile(path, content);
});
clearInterval(watch);
const bytes = await readFile(copy.path, 'utf8');
await copy.release();
parentPort.postMessage({ bytes, stats: cache.stats });
parentPort.close();
