import { execFile } from 'node:child_process';
import { mkdtemp, open, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { promisify } from 'node:util';
import type { BenchRow } from './bench-row.ts';
import { syntheticFrames } from './synthetic-extxyz.ts';

const run = promisify(execFile);
const child = fileURLToPath(new URL('./pipeline-child.ts', import.meta.url));

async function measure(args: string[]): Promise<Record<string, number>> {
  const { stdout } = await run(process.execPath, ['--import', 'tsx', child, ...args], { maxBuffer: 1 << 20 });
  return JSON.parse(stdout) as Record<string, number>;
}

/** File → engine → report numbers, with its memory measured against an idle runtime in the same run. */
export async function benchPipeline(): Promise<BenchRow[]> {
  const dir = await mkdtemp(join(tmpdir(), 'ergodic-bench-'));
  try {
    const path = join(dir, 'pipeline.extxyz');
    const handle = await open(path, 'w');
    for (const frame of syntheticFrames(4000)) await handle.write(frame);
    await handle.close();
    const baseline = await measure([path, '--baseline']);
    const result = await measure([path]);
    const dataMb = result['peakRssMb']! - baseline['peakRssMb']!;
    return [
      { name: 'pipeline: read + assemble 500 × 4000', seconds: result['readSeconds']! },
      { name: 'pipeline: msd+vacf+vdos+rdf+thermo', seconds: result['analyseSeconds']! },
      {
        name: 'pipeline peak RSS above the idle runtime', seconds: 0, reference: 'Float32 trajectory size (target ≤ 2)',
        ratio: dataMb / result['float32Mb']!,
        note: `peak ${result['peakRssMb']!.toFixed(0)} MiB, idle runtime ${baseline['peakRssMb']!.toFixed(0)} MiB, trajectory ${result['float32Mb']!.toFixed(0)} MiB`,
      },
    ];
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
}
