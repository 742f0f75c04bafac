import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { zipSync } from 'fflate';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { main } from '../../server/cli/main.ts';
import { lennardJonesExtxyz } from '../support/fixtures.ts';
import { writeExtxyz } from '../../server/formats/write-extxyz.ts';
import { SeededRandom } from '../../server/simulate/random.ts';

let dir: string;
let file: string;
/** Frames in the liquid file. */
let frames: number;

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'ergodic-cli-'));
  file = join(dir, 'liquid.extxyz');
  const liquid = await lennardJonesExtxyz({ productionSteps: 1000 });
  writeFileSync(file, liquid.bytes);
  frames = liquid.run.trajectory.nFrames;
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function capture() {
  const out: string[] = [];
  const err: string[] = [];
  const log = vi.spyOn(console, 'log').mockImplementation((...a: unknown[]) => void out.push(a.join(' ')));
  const error = vi.spyOn(console, 'error').mockImplementation((...a: unknown[]) => void err.push(a.join(' ')));
  return { out, err, restore: () => { log.mockRestore(); error.mockRestore(); } };
}

describe('ergodic analyze', () => {
  it('when given an extended XYZ file, then it prints a summary and writes the report JSON with summary, methods and curves', async () => {
    const json = join(dir, 'report.json');
    const io = capture();
    const code = await main(['analyze', file, '--analyses', 'thermo,msd,vacf', '--json', json]);
    io.restore();
    expect(code).toBe(0);
    expect(io.out.join('\n')).toMatch(/\[msd\][\s\S]*e9M2PerS/);
    const report = JSON.parse(readFileSync(json, 'utf8'));
    expect(report.analyses).toEqual(['thermo', 'msd', 'vacf']);
    expect(Object.keys(report.curves).sort()).toEqual(['msd', 'thermo', 'vacf']);
    expect(report.inputSha256).toMatch(/^[0-9a-f]{64}$/);
    expect(report.methods.caution).toMatch(/model/i);
  });

  it('when the same run is gzip-compressed, then the numbers are the same as for the plain file', async () => {
    const gz = join(dir, 'liquid.extxyz.gz');
    writeFileSync(gz, gzipSync(readFileSync(file)));
    const plainJson = join(dir, 'plain.json');
    const gzJson = join(dir, 'gz.json');
    const io = capture();
    await main(['analyze', file, '--analyses', 'msd', '--json', plainJson]);
    await main(['analyze', gz, '--analyses', 'msd', '--json', gzJson]);
    io.restore();
    const plain = JSON.parse(readFileSync(plainJson, 'utf8'));
    const compressed = JSON.parse(readFileSync(gzJson, 'utf8'));
    expect(compressed.summary).toEqual(plain.summary);
  });

  it('when the run is zipped, then its one trajectory inside is read and the numbers are the same as for the plain file', async () => {
    const zipped = join(dir, 'liquid.zip');
    writeFileSync(zipped, zipSync({ 'run/liquid.extxyz': readFileSync(file) }));
    const plainJson = join(dir, 'plain-for-zip.json');
    const zipJson = join(dir, 'zip.json');
    const io = capture();
    expect(await main(['analyze', file, '--analyses', 'thermo', '--json', plainJson])).toBe(0);
    expect(await main(['analyze', zipped, '--analyses', 'thermo', '--json', zipJson])).toBe(0);
    io.restore();
    expect(JSON.parse(readFileSync(zipJson, 'utf8')).summary).toEqual(JSON.parse(readFileSync(plainJson, 'utf8')).summary);
  });

  it('when asked for help, then the frame range, stride, equilibration discard and the estimate are listed', async () => {
    const io = capture();
    expect(await main(['--help'])).toBe(0);
    io.restore();
    const help = io.out.join('\n');
    for (const flag of ['--from-frame N', '--to-frame N', '--stride N', '--discard-ps X', '--estimate']) expect(help).toContain(flag);
  });

  it('when a frame range, a stride and a discard are given, then the estimate and the report use exactly those frames', async () => {
    const all = { frames };
    const flags = ['--from-frame', '10', '--to-frame', String(all.frames - 5), '--stride', '3', '--discard-ps', '0'];
    const io = capture();
    expect(await main(['analyze', file, '--analyses', 'thermo', ...flags, '--estimate'])).toBe(0);
    const json = join(dir, 'selected.json');
    expect(await main(['analyze', file, '--analyses', 'thermo', ...flags, '--json', json])).toBe(0);
    io.restore();
    const used = Math.ceil((all.frames - 5 - 10) / 3);
    const [selection, cost] = io.out[0]!.split('\n');
    expect(selection).toBe(`frames 10–${all.frames - 6}, every 3: ${used} used`);
    expect(cost).toMatch(/^estimated time [\d.]+ (s|min|h) \(reading [\d.]+ (s|min|h)\), peak memory about \d+ MiB$/);
    expect(JSON.parse(readFileSync(json, 'utf8')).methods.frames).toMatchObject({ from: 10, to: all.frames - 5, stride: 3, used, discardedFrames: 0 });
  });

  it('when the temperature drifts, then the summary suggests the equilibration discard as the flag to give next time', async () => {
    // Speeds start three times too high and relax as 1 + 2·e^(−f/80) over 800 frames 0.01 ps apart.
    const random = new SeededRandom(3);
    const atoms = 64, box = 14;
    const species = new Array<string>(atoms).fill('Ar');
    const cell = Float64Array.from([box, 0, 0, 0, box, 0, 0, 0, box]);
    const chunks: Uint8Array[] = [];
    for await (const c of writeExtxyz((function* () {
      for (let f = 0; f < 800; f++) {
        const positions = Float64Array.from({ length: 3 * atoms }, () => random.uniform() * box);
        const velocities = Float64Array.from({ length: 3 * atoms }, () => (1 + 2 * Math.exp(-f / 80)) * random.normal());
        yield { index: f, positions, velocities, species, cell, pbc: [true, true, true] as [boolean, boolean, boolean], time: f * 0.01 };
      }
    })())) chunks.push(c);
    const relaxing = join(dir, 'relaxing.extxyz');
    writeFileSync(relaxing, Buffer.concat(chunks));
    const io = capture();
    expect(await main(['analyze', relaxing, '--analyses', 'thermo'])).toBe(0);
    io.restore();
    const advice = io.out.join('\n').match(/The temperature drifts and settles after about ([\d.]+) ps from the start of the range: run again with --discard-ps ([\d.]+)\./);
    expect(advice).not.toBeNull();
    expect(advice![1]).toBe(advice![2]);
    // The excess temperature is over 50 % before 0.8 ps and below 2 % after 4 ps.
    expect(Number(advice![1])).toBeGreaterThan(0.8);
    expect(Number(advice![1])).toBeLessThan(5.6);
  });

  it.each([
    [['analyze', '/nonexistent/run.xyz'], /no such file/],
    [['analyze', 'FILE_PLACEHOLDER', '--analyses', 'msd,diffusion'], /unknown analysis "diffusion"/],
    [['analyze', 'FILE_PLACEHOLDER', '--length-unit', 'furlong'], /--length-unit must be one of/],
    [['analyze', 'FILE_PLACEHOLDER', '--dt-ps=-1'], /--dt-ps must be a positive number/],
    [['summarise', 'FILE_PLACEHOLDER'], /unknown command "summarise"/],
  ])('when called as %j, then it exits 1 saying what is wrong', async (args, message) => {
    const io = capture();
    const code = await main(args.map((a) => (a === 'FILE_PLACEHOLDER' ? file : a)));
    io.restore();
    expect(code).toBe(1);
    expect(io.err.join('\n')).toMatch(message);
  });
});
