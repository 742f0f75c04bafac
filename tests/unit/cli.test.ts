import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { main } from '../../server/cli/main.ts';
import { lennardJonesExtxyz } from '../support/fixtures.ts';

let dir: string;
let file: string;

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'ergodic-cli-'));
  file = join(dir, 'liquid.extxyz');
  writeFileSync(file, (await lennardJonesExtxyz({ productionSteps: 1000 })).bytes);
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
