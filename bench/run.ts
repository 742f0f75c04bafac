/**
 * `npm run bench`: speed and memory as ratios to references measured in the
 * same run on the same machine, so the figures mean something on any host.
 * Holds /tmp/ergodic-heavy.lock (run it as `flock /tmp/ergodic-heavy.lock
 * npm run bench` on a shared machine). Ends with the four headline figures.
 */
import type { BenchRow } from './bench-row.ts';
import { buildPrebuilt } from '../server/prebuilt/build.ts';
import { benchEnergy } from './energy.ts';
import { benchCostModel } from './cost-model.ts';
import { benchEndToEnd, E2E_TARGET, PARSE_TARGET } from './end-to-end.ts';
import { benchEngine } from './engine.ts';
import { benchFramesLoad, FRAMES_P95_TARGET_S } from './frames-load.ts';
import { benchMemory1Gb, PEAK_RSS_TARGET_MB } from './memory-1gb.ts';
import { benchPipeline } from './pipeline.ts';
import { benchReaders } from './readers.ts';
import { benchViewer } from './viewer.ts';

// As after an install: the command line and job threads start from their prebuilt bundles.
await buildPrebuilt({ log: (m) => console.log(m) });
const headline: Record<string, string> = {};
const suites: [string, () => Promise<BenchRow[]>][] = [
  ['end-to-end', async () => {
    const r = await benchEndToEnd();
    headline['end-to-end CLI time ÷ numpy/pandas peer'] = r.ratio === null ? 'skipped (no python3-pandas)' : `${r.ratio.toFixed(3)} (target ≤ ${E2E_TARGET})`;
    headline['parse ÷ byte scan (CLI reading path)'] = `${r.parseRatio.toFixed(3)} (target ≥ ${PARSE_TARGET})`;
    return r.rows;
  }],
  ['memory', async () => {
    const r = await benchMemory1Gb();
    headline['1 GB extended XYZ peak RSS'] = r.peakMb === null ? 'skipped (no GNU time)' : `${r.peakMb.toFixed(0)} MiB (target < ${PEAK_RSS_TARGET_MB} MB)`;
    return r.rows;
  }],
  ['frames', async () => {
    const r = await benchFramesLoad();
    headline['frames API p95, 50 viewers × 50 000 atoms'] = `${r.p95.toFixed(3)} s (target < ${FRAMES_P95_TARGET_S} s)`;
    return r.rows;
  }],
  ['readers', benchReaders],
  ['engine', benchEngine],
  ['energy', benchEnergy],
  ['cost', benchCostModel],
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
if (Object.keys(headline).length) {
  console.log('\n== headline figures (each measured in this run)');
  for (const [name, value] of Object.entries(headline)) console.log(`${name.padEnd(46)} ${value}`);
}
