/**
 * The command line as users run it, measured as whole processes in the same
 * run: `ergodic analyze FILE --analyses msd,vacf,vdos` on a 500-atom ×
 * 4000-frame extended XYZ with velocities (about 120 MB), against a
 * numpy/pandas script doing the same job (bench/cli-peer.py, Debian's
 * python3-pandas; skipped, and said so, when it is not installed). Startup,
 * reading and analysis are all inside both figures. Also the reader on the
 * path the command line takes, against a plain byte scan of the same file.
 */
import { execFile, spawnSync } from 'node:child_process';
import { createReadStream } from 'node:fs';
import { mkdtemp, open, rm, stat } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { promisify } from 'node:util';
import { readWhole } from '../server/cli/analyze-file.ts';
import { IN_MEMORY_COORDINATE_BYTES, withScratch } from '../server/out-of-core/scratch.ts';
import type { BenchRow } from './bench-row.ts';
import { syntheticFrames } from './synthetic-extxyz.ts';

const run = promisify(execFile);
const root = fileURLToPath(new URL('..', import.meta.url));
const DEBIAN_PYTHON = '/usr/bin/python3';
const FRAMES = 4000;
export const E2E_TARGET = 0.5;
export const PARSE_TARGET = 0.4;

async function seconds(command: string, args: string[]): Promise<number> {
  const t0 = performance.now();
  await run(command, args, { cwd: root, maxBuffer: 16 * 1024 * 1024 });
  return (performance.now() - t0) / 1000;
}

function pandasAvailable(): boolean {
  return spawnSync(DEBIAN_PYTHON, ['-c', 'import numpy, pandas'], { stdio: 'ignore' }).status === 0;
}

/** Newlines counted with a byte loop over the same chunks the readers get. */
async function byteScan(path: string): Promise<number> {
  let lines = 0;
  for await (const chunk of createReadStream(path, { highWaterMark: 1024 * 1024 }) as AsyncIterable<Buffer>) {
    for (let i = 0; i < chunk.length; i++) if (chunk[i] === 10) lines++;
  }
  return lines;
}

export interface EndToEnd {
  rows: BenchRow[];
  /** ergodic ÷ peer, whole processes; null when the peer could not run. */
  ratio: number | null;
  parseRatio: number;
}

export async function benchEndToEnd(): Promise<EndToEnd> {
  const dir = await mkdtemp(join(tmpdir(), 'ergodic-bench-e2e-'));
  try {
    const path = join(dir, 'run.extxyz');
    const handle = await open(path, 'w');
    for (const frame of syntheticFrames(FRAMES)) await handle.write(frame);
    await handle.close();
    const mb = (await stat(path)).size / 1e6;
    const rows: BenchRow[] = [];

    // Reading as the command line reads (its own function: parse, validate, assemble Float32, plan) against a byte scan.
    // Taken in turns, best of three each: the machine may be shared, and the fastest run is the least disturbed.
    let scanS = Infinity;
    let parseS = Infinity;
    let lines = 0;
    let traj!: Awaited<ReturnType<typeof readWhole>>['traj'];
    for (let round = 0; round < 3; round++) {
      const t0 = performance.now();
      lines = await byteScan(path);
      scanS = Math.min(scanS, (performance.now() - t0) / 1000);
      const t1 = performance.now();
      ({ traj } = await withScratch(IN_MEMORY_COORDINATE_BYTES, (spill) => readWhole(path, {
        analyses: ['msd', 'vacf', 'vdos'], params: {}, lengthUnit: 'angstrom', timeUnit: 'ps', velocityUnit: 'angstrom/ps',
      }, spill)));
      parseS = Math.min(parseS, (performance.now() - t1) / 1000);
    }
    if (traj.nFrames !== FRAMES || lines !== FRAMES * (traj.nAtoms + 2)) throw new Error('the bench file was misread');
    const parseRatio = scanS / parseS;
    rows.push({
      name: `read as the CLI reads, ${mb.toFixed(0)} MB extended XYZ`, seconds: parseS, reference: 'byte scan of the same file (best of 3 each)', ratio: parseRatio,
      note: `${(mb / parseS).toFixed(0)} MB/s parsed, ${(mb / scanS).toFixed(0)} MB/s scanned; target ≥ ${PARSE_TARGET} ${parseRatio >= PARSE_TARGET ? 'met' : 'NOT met'}`,
    });

    const args = ['bin/ergodic.mjs', 'analyze', path, '--analyses', 'msd,vacf,vdos'];
    const ergodicS = await seconds(process.execPath, args);
    let ratio: number | null = null;
    if (pandasAvailable()) {
      const peerS = await seconds(DEBIAN_PYTHON, [join(root, 'bench/cli-peer.py'), path]);
      ratio = ergodicS / peerS;
      rows.push({
        name: 'ergodic analyze msd,vacf,vdos, whole process', seconds: ergodicS, reference: 'numpy/pandas peer, whole process', ratio,
        note: `peer ${peerS.toFixed(2)} s; target ≤ ${E2E_TARGET} ${ratio <= E2E_TARGET ? 'met' : 'NOT met'} (stretch 0.25)`,
      });
    } else {
      rows.push({ name: 'ergodic analyze msd,vacf,vdos, whole process', seconds: ergodicS, note: `peer SKIPPED: ${DEBIAN_PYTHON} has no numpy/pandas (apt-get install python3-pandas)` });
    }
    return { rows, ratio, parseRatio };
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
}
