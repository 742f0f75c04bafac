/**
 * The frames API under load: 50 viewers of a 50 000-atom trajectory at
 * once, each playing through the frames one request at a time as the
 * viewer does, against the server started as in production (its worker in a
 * child process). Reports the 95th percentile of request times. The
 * viewers are plain HTTP clients (fetch, with the signed-in session's
 * cookies) so that what is timed is the server, not a client library's own
 * encoding of each 0.6 MB body.
 */
import { request } from '@playwright/test';
import { loadConfig } from '../server/config.ts';
import { startServer } from '../server/main.ts';
import { startTestStack } from '../scripts/services/test-stack.ts';
import { freePort } from '../scripts/services/wait-for-port.ts';
import { syntheticSystemExtxyz } from '../tests/support/synthetic-system.ts';
import type { BenchRow } from './bench-row.ts';
import { uploadForViewer } from './viewer-upload.ts';

const ATOMS = 50_000;
const FRAMES = 12;
const VIEWERS = 50;
export const FRAMES_P95_TARGET_S = 1;

function percentile(sorted: number[], p: number): number {
  return sorted[Math.min(sorted.length - 1, Math.ceil(p * sorted.length) - 1)]!;
}

export async function benchFramesLoad(): Promise<{ rows: BenchRow[]; p95: number }> {
  const stack = await startTestStack();
  const server = await startServer(loadConfig({ ...process.env, ...stack.env, PORT: String(await freePort()), LOG_LEVEL: 'warn' }));
  try {
    const owner = await request.newContext({ baseURL: server.url });
    const { state, trajectoryId } = await uploadForViewer(owner, 'bench-50k.extxyz', syntheticSystemExtxyz(ATOMS, FRAMES));
    await owner.dispose();
    const cookie = state.cookies.map((c) => `${c.name}=${c.value}`).join('; ');
    const times: number[] = [];
    const t0 = performance.now();
    await Promise.all(Array.from({ length: VIEWERS }, async (_, v) => {
      for (let k = 0; k < FRAMES; k++) {
        // Viewers start at different places in the run, as people scrub.
        const frame = (k + v) % FRAMES;
        const start = performance.now();
        const res = await fetch(`${server.url}/api/trajectories/${trajectoryId}/frames?from=${frame}&to=${frame + 1}`, { headers: { cookie } });
        const body = await res.arrayBuffer();
        if (res.status !== 200 || body.byteLength < ATOMS * 12) throw new Error(`frames request failed: HTTP ${res.status}`);
        times.push((performance.now() - start) / 1000);
      }
    }));
    const wall = (performance.now() - t0) / 1000;
    times.sort((a, b) => a - b);
    const p95 = percentile(times, 0.95);
    return {
      p95,
      rows: [{
        name: `frames API, ${VIEWERS} viewers of ${ATOMS} atoms at once, p95`, seconds: p95,
        note: `median ${percentile(times, 0.5).toFixed(3)} s, max ${times.at(-1)!.toFixed(3)} s over ${times.length} requests of one frame (${(ATOMS * 12 / 1e6).toFixed(1)} MB each) in ${wall.toFixed(1)} s; target < ${FRAMES_P95_TARGET_S} s ${p95 < FRAMES_P95_TARGET_S ? 'met' : 'NOT met'}`,
      }],
    };
  } finally {
    await server.stop();
    await stack.stop();
  }
}
