// Module hooks (see plain-packages.mjs): packages listed here are loaded by
// Node's own loader, never handed to the TypeScript loader behind this one.
import { readFile } from 'node:fs/promises';

/**
 * h5wasm ships its WebAssembly inside one 4 MB line of JavaScript; the
 * TypeScript loader would rewrite its dynamic imports and build a
 * per-token source map of that line, which costs about 600 MB per thread.
 * It is plain JavaScript and needs no transform.
 */
const PLAIN = ['/node_modules/h5wasm/'];

export async function load(url, context, nextLoad) {
  if (url.startsWith('file:') && PLAIN.some((part) => url.includes(part)) && /\.m?js(\?|$)/.test(url)) {
    return { format: 'module', source: await readFile(new URL(url)), shortCircuit: true };
  }
  return nextLoad(url, context);
}
