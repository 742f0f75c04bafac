import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { main } from '../../server/cli/main.ts';
import { lennardJonesExtxyz } from '../support/fixtures.ts';

let dir: string;
let file: string;

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'ergodic-cli-potential-'));
  file = join(dir, 'liquid.extxyz');
  writeFileSync(file, (await lennardJonesExtxyz({ productionSteps: 1000 })).bytes);
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

async function run(args: string[]) {
  const out: string[] = [], err: string[] = [];
  const log = vi.spyOn(console, 'log').mockImplementation((...a: unknown[]) => void out.push(a.join(' ')));
  const error = vi.spyOn(console, 'error').mockImplementation((...a: unknown[]) => void err.push(a.join(' ')));
  try {
    return { code: await main(args), out: out.join('\n'), err: err.join('\n') };
  } finally {
    log.mockRestore();
    error.mockRestore();
  }
}

describe('ergodic analyze --potential', () => {
  it('when the model is the documented one-line argon form, then the energy analysis runs truncated, unshifted, without tail, and the JSON carries summary.energy and the model', async () => {
    const model = join(dir, 'argon.json');
    writeFileSync(model, '{"pairs": [{"species": ["Ar","Ar"], "form": "lj", "epsilonEV": 0.0103236, "sigmaA": 3.405, "cutoffA": 10.5}]}');
    const json = join(dir, 'report.json');
    const r = await run(['analyze', file, '--potential', model, '--analyses', 'energy', '--ensemble', 'NVE', '--json', json]);
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/\[energy\][\s\S]*potentialPerAtomEV/);
    const report = JSON.parse(readFileSync(json, 'utf8'));
    const e = report.summary.energy;
    for (const q of [e.potentialPerAtomEV, e.pressureBar]) {
      expect(Number.isFinite(q.mean)).toBe(true);
      expect(q.stdError).toBeGreaterThan(0);
    }
    expect(e.tail).toBeNull();
    expect(report.methods.energy.resolvedPairs[0]).toMatchObject({ truncation: 'truncated', tailCorrection: false, cutoffA: 10.5, epsilonEV: 0.0103236 });
    expect(report.curves.energy.columns).toContain('potential energy');
  });

  it('when a tabulated pair names its CSV file, then the table is read relative to the model file', async () => {
    const rows = ['r_A,U_eV'];
    for (let r = 2.5; r <= 10.5001; r += 0.05) {
      const s6 = (3.405 / r) ** 6;
      rows.push(`${r.toFixed(3)},${4 * 0.0103236 * (s6 * s6 - s6)}`);
    }
    writeFileSync(join(dir, 'ar-ar.csv'), rows.join('\n'));
    const model = join(dir, 'table.json');
    writeFileSync(model, JSON.stringify({ pairs: [{ species: ['Ar', 'Ar'], form: 'table', energyUnit: 'eV', csvFile: 'ar-ar.csv', cutoffA: 10.5 }] }));
    const lj = join(dir, 'lj.json');
    writeFileSync(lj, '{"pairs": [{"species": ["Ar","Ar"], "form": "lj", "epsilonEV": 0.0103236, "sigmaA": 3.405, "cutoffA": 10.5}]}');
    const ja = join(dir, 'a.json'), jb = join(dir, 'b.json');
    expect((await run(['analyze', file, '--potential', model, '--analyses', 'energy', '--json', ja])).code).toBe(0);
    expect((await run(['analyze', file, '--potential', lj, '--analyses', 'energy', '--json', jb])).code).toBe(0);
    const mean = (p: string): number => JSON.parse(readFileSync(p, 'utf8')).summary.energy.potentialPerAtomEV.mean;
    const ua = mean(ja), ub = mean(jb);
    expect(Math.abs(ua / ub - 1)).toBeLessThan(1e-5);
  });

  it('when the model file has a wrong field or is missing, then the command fails naming the file and the field', async () => {
    const bad = join(dir, 'bad.json');
    writeFileSync(bad, '{"pairs": [{"species": ["Ar","Ar"], "form": "lj", "epsilonEV": 0.0103236, "sigma": 3.405, "cutoffA": 10.5}]}');
    const r = await run(['analyze', file, '--potential', bad]);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/bad\.json is not a valid interaction model:[\s\S]*pairs\[0\] \(Ar–Ar\): unknown field sigma/);
    const missing = await run(['analyze', file, '--potential', join(dir, 'nope.json')]);
    expect(missing.err).toMatch(/nope\.json: no such file/);
  });
});
