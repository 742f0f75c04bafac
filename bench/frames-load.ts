/**
 * The frames API under load: 50 viewers of a 50 000-atom trajectory at
 * once, each playing through the frames one request at a time as the
 * viewer does, against the server started as in production: server/main.ts
 * in its own process (with its worker in a child of that), so the viewers'
 * HTTP clients here do not share the server's event loop and their time
 * spent receiving 0.6 MB bodies is not counted as the server's. Reports
 * the 95th percentile of request times, and the server process's CPU time
 * per request (less noisy than wall time on a shared machine). The viewers
 * are plain HTTP clients (node:http, with the signed-in session's cookies)
 * so that what is timed is the server, not a client library's own encoding
 * of each body. To see where the server's time goes, give it node options:
 * FRAMES_BENCH_SERVER_NODE_ARGS="--cpu-prof --cpu-prof-dir=/tmp/frames-prof".
 */
import { readFileSync } from 'node:fs';
import { Agent, get } from 'node:http';
import { request } from '@playwright/test';
import { startTestStack } from '../scripts/services/test-stack.ts';
import { syntheticSystemExtxyz } from '../tests/support/synthetic-system.ts';
import type { BenchRow } from './bench-row.ts';
import { startServerProcess } from './server-process.ts';
import { uploadForViewer } from './viewer-upload.ts';

const ATOMS = 50_000;
const FRAMES = 12;
const VIEWERS = 50;
export const FRAMES_P95_TARGET_S = 1;

function percentile(sorted: number[], p: number): number {
  return sorted[Math.min(sorted.length - 1, Math.ceil(p * sorted.length) - 1)]!;
}

/** User plus system CPU seconds a process has used so far, from /proc (null where there is none). */
function cpuSecondsOf(pid: number): number | null {
  try {
    const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').replace(/^.*\) /s, '').split(' ');
    // utime and stime are fields 14 and 15 of stat(5), in clock ticks (100 per second on Linux).
    return (Number(fields[11]) + Number(fields[12])) / 100;
  } catch {
    return null;
  }
}

/**
 * A GET whose body is counted as it arrives and not kept: each viewer's
 * browser keeps its frames on its own machine, and joining 0.6 MB bodies
 * here would spend this machine's cores, which the server needs, on it.
 */
function getCounting(agent: Agent, url: string, cookie: string): Promise<{ status: number; bytes: number }> {
  return new Promise((resolve, reject) => {
    const req = get(url, { agent, headers: { cookie } }, (res) => {
      let bytes = 0;
      res.on('data', (chunk: Buffer) => { bytes += chunk.length; });
      res.on('end', () => resolve({ status: res.statusCode ?? 0, bytes }));
      res.on('error', reject);
    });
    req.on('error', reject);
  });
}

export async function benchFramesLoad(): Promise<{ rows: BenchRow[]; p95: number }> {
  const stack = await startTestStack();
  let server: Awaited<ReturnType<typeof startServerProcess>> | null = null;
  try {
    const running = await startServerProcess({ ...stack.env, LOG_LEVEL: 'warn' },
      process.env['FRAMES_BENCH_SERVER_NODE_ARGS']?.split(/\s+/).filter(Boolean));
    server = running;
    const owner = await request.newContext({ baseURL: server.url });
    const { state, trajectoryId } = await uploadForViewer(owner, 'bench-50k.extxyz', syntheticSystemExtxyz(ATOMS, FRAMES));
    await owner.dispose();
    const cookie = state.cookies.map((c) => `${c.name}=${c.value}`).join('; ');
    // One connection per viewer, kept open between its requests as a browser keeps it.
    const agent = new Agent({ keepAlive: true, maxSockets: VIEWERS });
    const times: number[] = [];
    const cpu0 = cpuSecondsOf(running.pid);
    const clientCpu0 = process.cpuUsage();
    const t0 = performance.now();
    await Promise.all(Array.from({ length: VIEWERS }, async (_, v) => {
      for (let k = 0; k < FRAMES; k++) {
        // Viewers start at different places in the run, as people scrub.
        const frame = (k + v) % FRAMES;
        const start = performance.now();
        const { status, bytes } = await getCounting(agent, `${running.url}/api/trajectories/${trajectoryId}/frames?from=${frame}&to=${frame + 1}`, cookie);
        if (status !== 200 || bytes < ATOMS * 12) throw new Error(`frames request failed: HTTP ${status}, ${bytes} bytes`);
        times.push((performance.now() - start) / 1000);
      }
    }));
    const wall = (performance.now() - t0) / 1000;
    agent.destroy();
    const cpu1 = cpuSecondsOf(running.pid);
    const clientCpu = process.cpuUsage(clientCpu0);
    const cpuPerRequest = cpu0 === null || cpu1 === null ? '' : `; server CPU ${((cpu1 - cpu0) / times.length * 1000).toFixed(1)} ms per request, viewers' CPU ${((clientCpu.user + clientCpu.system) / 1000 / times.length).toFixed(1)} ms per request`;
    times.sort((a, b) => a - b);
    const p95 = percentile(times, 0.95);
    return {
      p95,
      rows: [{
        name: `frames API, ${VIEWERS} viewers of ${ATOMS} atoms at once, p95`, seconds: p95,
        note: `median ${percentile(times, 0.5).toFixed(3)} s, max ${times.at(-1)!.toFixed(3)} s over ${times.length} requests of one frame (${(ATOMS * 12 / 1e6).toFixed(1)} MB each) in ${wall.toFixed(1)} s${cpuPerRequest}; target < ${FRAMES_P95_TARGET_S} s ${p95 < FRAMES_P95_TARGET_S ? 'met' : 'NOT met'}`,
      }],
    };
  } finally {
    await server?.stop();
    await stack.stop();
  }
}
