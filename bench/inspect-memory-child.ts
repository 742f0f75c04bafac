/**
 * Runs in its own process so its peak RSS measures inspection alone:
 * inspects ~N bytes of extended XYZ produced on the fly and prints JSON.
 */
import { inspectTrajectory } from '../server/formats/inspect.ts';
import { syntheticFrames } from './synthetic-extxyz.ts';

const targetBytes = Number(process.argv[2] ?? 1024 ** 3);

async function* upTo(bytes: number): AsyncGenerator<Buffer> {
  let sent = 0;
  for (const frame of syntheticFrames(Number.MAX_SAFE_INTEGER)) {
    if (sent >= bytes) return;
    sent += frame.length;
    yield frame;
  }
}

const before = process.memoryUsage.rss();
const start = performance.now();
const info = await inspectTrajectory(upTo(targetBytes), 'streamed.extxyz');
const seconds = (performance.now() - start) / 1000;
process.stdout.write(
  JSON.stringify({ frames: info.frames, bytes: info.bytes, seconds, rssBeforeMb: before / 1024 ** 2, peakRssMb: process.resourceUsage().maxRSS / 1024 }),
);
