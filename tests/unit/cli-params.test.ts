import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { analysisParamsSchema } from '../../shared/analysis-params.ts';
import { main } from '../../server/cli/main.ts';
import { lennardJonesExtxyz } from '../support/fixtures.ts';

let dir: string;
let file: string;

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'ergodic-cli-params-'));
  file = join(dir, 'liquid.extxyz');
  writeFileSync(file, (await lennardJonesExtxyz({ productionSteps: 600 })).bytes);
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

function paramsFile(name: string, content: unknown): string {
  const path = join(dir, name);
  writeFileSync(path, typeof content === 'string' ? content : JSON.stringify(content));
  return path;
}

describe('ergodic analyze --params', () => {
  it('when the file holds API params, then the run uses exactly them: the report records them as the API schema fills them in', async () => {
    const given = { binWidthA: 0.02, rMaxA: 6, fitWindow: { mode: 'manual', startPs: 0.5, endPs: 2 }, components: 'xy', window: 'blackman', fromFrame: 10 };
    const json = join(dir, 'with-params.json');
    const r = await run(['analyze', file, '--params', paramsFile('p.json', given), '--analyses', 'msd,rdf', '--json', json]);
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    const report = JSON.parse(readFileSync(json, 'utf8'));
    const expected = analysisParamsSchema.parse(given);
    for (const key of Object.keys(given)) expect(report.params[key]).toEqual(expected[key as keyof typeof expected]);
    expect(report.summary.msd.dimensions).toBe(2);
    expect(report.methods.rdf.binWidthA).toBe(0.02);
    expect(report.methods.frames.from).toBe(10);
  });

  it('when the file is a whole API request body, then its analyses are run with its params', async () => {
    const json = join(dir, 'body.json');
    const body = { analyses: ['thermo'], params: { discardPs: 0.5 }, notes: 'scripted check' };
    const r = await run(['analyze', file, '--params', paramsFile('body-in.json', body), '--json', json]);
    expect(r.err).toBe('');
    const report = JSON.parse(readFileSync(json, 'utf8'));
    expect(report.analyses).toEqual(['thermo']);
    expect(report.params.discardPs).toBe(0.5);
  });

  it('when a flag sets a setting the file leaves out, then both apply', async () => {
    const json = join(dir, 'merged.json');
    const r = await run(['analyze', file, '--params', paramsFile('merge.json', { binWidthA: 0.1 }), '--r-max', '5', '--analyses', 'rdf', '--json', json]);
    expect(r.err).toBe('');
    const report = JSON.parse(readFileSync(json, 'utf8'));
    expect(report.params.binWidthA).toBe(0.1);
    expect(report.params.rMaxA).toBe(5);
  });

  it.each([
    ['a value out of bounds', { binWidthA: 0.0001 }, [], /--params .*bad\.json has invalid settings:\n\s+binWidthA: must be at least 0\.005 Å/],
    ['a nested field wrong', { fitWindow: { mode: 'manual', startPs: 3, endPs: 1 } }, [], /fitWindow.*must end after it starts/],
    ['a misspelt setting', { binWidth: 0.02 }, [], /unknown setting "binWidth"; the settings are .*binWidthA/],
    ['a misspelt setting inside a body', { analyses: ['msd'], params: { fitWindw: {} } }, [], /unknown setting "params\.fitWindw"/],
    ['an unknown analysis inside a body', { analyses: ['diffusion'], params: {} }, [], /not a valid analysis request:\n\s+analyses\.0/],
    ['not an object', [1, 2], [], /must hold a JSON object of analysis settings/],
    ['not JSON', '{"binWidthA": 0.02,', [], /not JSON/],
    ['the same setting as a flag', { temperatureK: 300 }, ['--temperature', '310'], /--temperature and --params .*bad\.json both set temperatureK: give it in one place/],
    ['analyses both in a body and a flag', { analyses: ['msd'], params: {} }, ['--analyses', 'thermo'], /--analyses and --params .*both choose the analyses/],
    ['a flag that breaks a rule with the file', { binWidthA: 0.005 }, ['--r-max', '500'], /with the flags given is invalid:\n\s+binWidthA: rMaxA \/ binWidthA must be at most/],
  ])('when the file has %s, then it exits 1 naming the file and the field', async (_case, content, flags, message) => {
    const r = await run(['analyze', file, '--params', paramsFile('bad.json', content), ...flags]);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(message);
  });

  it('when the params file does not exist, then it says so', async () => {
    const r = await run(['analyze', file, '--params', join(dir, 'missing.json')]);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/--params .*missing\.json: no such file/);
  });

  it('when asked for help, then --params is described with which flags combine with it', async () => {
    const r = await run(['--help']);
    expect(r.out).toMatch(/--params FILE[\s\S]*same setting in both is refused/);
  });
});
