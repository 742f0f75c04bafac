/**
 * Peak memory of `ergodic analyze --analyses msd,vacf,vdos,rdf` on a 1 GB
 * extended XYZ (500 atoms with velocities, about 34 000 frames), measured
 * as the whole process's maximum resident set by GNU time.
 * `BENCH_MEMORY_GB=10 npm run bench -- memory` checks a bigger file the same
 * way (see the README: not part of CI, it needs twice the size in TMPDIR).
 */
import { execFile } from 'node:child_process';
import { existsSync } from 'node:fs';
import { mkdtemp, open, rm, stat } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { promisify } from 'node:util';
import type { BenchRow } from './bench-row.ts';
import { syntheticFrames } from './synthetic-extxyz.ts';

const root = fileURLToPath(new URL('..', import.meta.url));
const TARGET_BYTES = Number(process.env['BENCH_MEMORY_GB'] ?? 1) * 1024 ** 3;
export const PEAK_RSS_TARGET_MB = 300;

export async function benchMemory1Gb(): Promise<{ rows: BenchRow[]; peakMb: number | null }> {
  if (!existsSync('/usr/bin/time')) {
    return { peakMb: null, rows: [{ name: '1 GB extended XYZ, peak RSS', seconds: 0, note: 'SKIPPED: /usr/bin/time (GNU time) is not installed (apt-get install time)' }] };
  }
  const dir = await mkdtemp(join(tmpdir(), 'ergodic-bench-1gb-'));
  try {
    const path = join(dir, 'big.extxyz');
    const handle = await open(path, 'w');
    let written = 0;
    for (const frame of syntheticFrames(1_000_000)) {
      if (written >= TARGET_BYTES) break;
      await handle.write(frame);
      written += frame.length;
    }
    await handle.close();
    const size = (await stat(path)).size;
    const t0 = performance.now();
    const { stderr } = await promisify(execFile)('/usr/bin/time', ['-f', 'peak-rss-kb %M', process.execPath, 'bin/ergodic.mjs', 'analyze', path, '--analyses', 'msd,vacf,vdos,rdf'],
      { cwd: root, maxBuffer: 16 * 1024 * 1024 });
    const seconds = (performance.now() - t0) / 1000;
    const peakMb = Number(/peak-rss-kb (\d+)/.exec(stderr)?.[1]) / 1024;
    return {
      peakMb,
      rows: [{
        name: `${(size / 1e9).toFixed(2)} GB extended XYZ, msd+vacf+vdos+rdf, peak RSS`, seconds,
        note: `peak ${peakMb.toFixed(0)} MiB for the whole process; target < ${PEAK_RSS_TARGET_MB} MB ${peakMb < PEAK_RSS_TARGET_MB ? 'met' : 'NOT met'}`,
      }],
    };
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
}
