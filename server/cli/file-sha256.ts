/**
 * The sha256 of a local file, computed in a thread of its own: hashing is
 * synchronous work, and on the main thread it would take turns with
 * parsing the same file instead of running beside it.
 */
import { Worker } from 'node:worker_threads';

// Self-contained, so it runs the same from the TypeScript sources and from a prebuilt bundle.
const HASHER = `
const { createHash } = require('node:crypto');
const { createReadStream } = require('node:fs');
const { parentPort, workerData } = require('node:worker_threads');
const hash = createHash('sha256');
createReadStream(workerData, { highWaterMark: 1024 * 1024 })
  .on('data', (chunk) => hash.update(chunk))
  .on('error', (err) => parentPort.postMessage({ error: err.message }))
  .on('end', () => parentPort.postMessage({ hex: hash.digest('hex') }));
`;

export function fileSha256(path: string): Promise<string> {
  return new Promise((resolve, reject) => {
    const worker = new Worker(HASHER, { eval: true, workerData: path });
    worker.once('message', (reply: { hex?: string; error?: string }) => {
      void worker.terminate();
      if (reply.hex) resolve(reply.hex);
      else reject(new Error(`could not read ${path}: ${reply.error}`));
    });
    worker.once('error', reject);
  });
}
