/**
 * `npm run bench`: speed and memory as ratios to references measured in the
 * same run on the same machine, so the figures mean something on any host.
 */
import type { BenchRow } from './bench-row.ts';
import { benchEnergy } from './energy.ts';
import { benchEngine } from './engine.ts';
import { benchPipeline } from './pipeline.ts';
import { benchReaders } from './readers.ts';
import { benchViewer } from './viewer.ts';

const suites: [string, () => Promise<BenchRow[]>][] = [
  ['readers', benchReaders],
  ['engine', benchEngine],
  ['energy', benchEnergy],
  ['pipeline', benchPipeline],
  ['viewer', benchViewer],
];
const only = process.argv[2];
for (const [name, bench] of suites) {
  if (only && only !== name) continue;
  console.log(`\n== ${name}`);
  for (const row of await bench()) {
    const ratio = row.ratio === undefined ? '' : `  ratio ${row.ratio.toFixed(3)}${row.reference ? ` vs ${row.reference}` : ''}`;
    console.log(`${row.name.padEnd(42)} ${row.seconds ? `${row.seconds.toFixed(3)} s` : ''}${ratio}${row.note ? `  (${row.note})` : ''}`);
  }
}
