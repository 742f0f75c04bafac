/**
 * Resident memory of a job thread reading its first H5MD file, step by
 * step: loading the HDF5 module, opening the file, describing it, reading
 * every frame. Run by hand (`node --import tsx bench/h5md-memory.ts
 * [atoms] [frames]`); it writes a float64 H5MD of atoms × frames × 3
 * positions and velocities into a temp folder, reads it in a worker thread
 * running from source as inspection does (gzip-spooled), once with h5wasm
 * through the TypeScript loader and once kept away from it, then reads a
 * range of 40 frames from a decompressed copy as an older upload's local
 * copy is read, and prints the RSS after each step and the peak RSS of the
 * process. Positions are read one hyperslab of about 8 MiB of frames at a
 * time, so the figures should not grow with the number of frames: run it
 * with more frames to see. The peak is VmHWM on Linux (see `peakKiB`).
 */
import { readFileSync } from 'node:fs';
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Worker, isMainThread, parentPort, workerData } from 'node:worker_threads';
import { gzipSync } from 'node:zlib';

const MiB = 1024 ** 2;
const rss = () => Math.round(process.memoryUsage().rss / MiB);

interface Job {
  path: string;
  name: string;
  /** Keep h5wasm away from the TypeScript loader (server/prebuilt/plain-packages.mjs). */
  guard: boolean;
}

async function inThread({ path, name }: Job): Promise<void> {
  // Each read spools into a folder of its own, as a job does.
  const tempDir = await mkdtemp(join(tmpdir(), 'ergodic-h5md-memory-spool-'));
  const peak = () => Math.round(peakKiB() / 1024);
  const report = (step: string) => parentPort!.postMessage({ step, rssMiB: rss(), peakMiB: peak() });
  report('thread started');
  const h5 = await import('h5wasm/node');
  await h5.ready;
  report('HDF5 module loaded');
  const { openTrajectory } = await import('../server/formats/open-trajectory.ts');
  const { createReadStream } = await import('node:fs');
  // Streamed from disk as an upload arrives, so the compressed file is not held here and the figures are the reader's.
  async function* stream() {
    yield* createReadStream(path, { highWaterMark: 64 * 1024 }) as AsyncIterable<Buffer>;
  }
  const opened = await openTrajectory(stream(), name, { tempDir });
  let frames = 0;
  for await (const frame of opened.frames) {
    if (frames === 0) report('first frame read');
    frames++;
    void frame;
  }
  report(`all ${frames} frames read`);
  const again = await openTrajectory(stream(), name, { tempDir });
  for await (const frame of again.frames) void frame;
  report('second file read in the same thread');
  // Decompressed by streaming, as the local copy is made, so the copy itself costs no memory here.
  const { createGunzip } = await import('node:zlib');
  const { createWriteStream } = await import('node:fs');
  const { pipeline } = await import('node:stream/promises');
  const copy = join(tempDir, 'local-copy.h5');
  await pipeline(createReadStream(path), createGunzip(), createWriteStream(copy));
  const { readFrames } = await import('../server/formats/read-frames.ts');
  const from = Math.floor(frames / 4);
  let ranged = 0;
  for await (const frame of readFrames(copy, { from, to: from + 40 })) {
    ranged++;
    void frame;
  }
  report(`frames [${from}, ${from + ranged}) of a local copy`);
  await rm(tempDir, { recursive: true, force: true });
}

/**
 * The highest RSS of this process so far, in KiB. On Linux from VmHWM, which
 * starts afresh at exec: getrusage's maxRSS keeps the high mark of the
 * process that spawned this one (here the sample writer) across exec.
 */
function peakKiB(): number {
  try {
    const line = readFileSync('/proc/self/status', 'utf8').split('\n').find((l) => l.startsWith('VmHWM:'));
    if (line) return Number(line.replace(/\D+/g, ''));
  } catch {
    // No /proc: fall back to getrusage below.
  }
  return process.resourceUsage().maxRSS;
}

async function writeSample(dir: string, atoms: number, frames: number): Promise<string> {
  const h5 = await import('h5wasm/node');
  await h5.ready;
  const path = join(dir, 'sample.h5');
  const file = new h5.File(path, 'w');
  const all = file.create_group('particles').create_group('all');
  const values = new Float64Array(frames * atoms * 3);
  // A lattice with small displacements: compresses well, as real H5MD often does.
  for (let f = 0; f < frames; f++) for (let a = 0; a < atoms; a++) {
    for (let d = 0; d < 3; d++) values[(f * atoms + a) * 3 + d] = ((a >> (d * 5)) & 31) * 3.4 + (f % 7) * 0.001;
  }
  for (const name of ['position', 'velocity']) {
    const group = all.create_group(name);
    group.create_dataset({ name: 'value', data: values, shape: [frames, atoms, 3] });
    group.create_dataset({ name: 'time', data: Float64Array.from({ length: frames }, (_, k) => k * 0.01) });
  }
  const box = all.create_group('box');
  box.create_attribute('dimension', 3);
  box.create_attribute('boundary', ['periodic', 'periodic', 'periodic']);
  box.create_dataset({ name: 'edges', data: Float64Array.from([108.8, 108.8, 108.8]) });
  file.close();
  const gz = join(dir, 'sample.h5.gz');
  await writeFile(gz, gzipSync(await readFile(path), { level: 6 }));
  return gz;
}

async function main(): Promise<void> {
  const atoms = Number(process.argv[2] ?? 10_000);
  const frames = Number(process.argv[3] ?? 400);
  const dir = await mkdtemp(join(tmpdir(), 'ergodic-h5md-memory-'));
  try {
    const path = await writeSample(dir, atoms, frames);
    const { size } = await import('node:fs/promises').then((fs) => fs.stat(path));
    console.log(`sample: ${atoms} atoms × ${frames} frames, ${(size / MiB).toFixed(1)} MiB gzip, ${((atoms * frames * 48) / MiB).toFixed(0)} MiB of positions and velocities`);
    // Measured in a fresh process so the writer's module does not count.
    const { spawnSync } = await import('node:child_process');
    for (const guard of [false, true]) {
      console.log(guard ? '\n— h5wasm kept away from the TypeScript loader (as now)' : '\n— h5wasm through the TypeScript loader (as before)');
      const child = spawnSync(process.execPath, ['--import', 'tsx', new URL(import.meta.url).pathname, '--read', path, String(guard)], { encoding: 'utf8', stdio: ['ignore', 'pipe', 'inherit'] });
      process.stdout.write(child.stdout);
    }
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
}

async function readInWorker(path: string, guard: boolean): Promise<void> {
  const before = rss();
  console.log(`process before the thread: ${before} MiB`);
  const worker = new Worker(new URL('./h5md-memory-thread.mjs', import.meta.url), { workerData: { path, name: 'sample.h5.gz', guard } satisfies Job });
  // The peak (maxRSS, of the whole process) is the highest RSS so far, between steps included.
  worker.on('message', (m: { step: string; rssMiB: number; peakMiB: number }) =>
    console.log(`${m.step.padEnd(40)} ${String(m.rssMiB).padStart(6)} MiB  (+${m.rssMiB - before})  peak so far ${m.peakMiB} MiB`));
  await new Promise((resolve, reject) => worker.once('exit', resolve).once('error', reject));
}

if (!isMainThread) await inThread(workerData as Job);
else if (process.argv[2] === '--read') await readInWorker(process.argv[3]!, process.argv[4] === 'true');
else await main();
