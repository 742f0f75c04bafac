import { describe, expect, it } from 'vitest';
import { parseLinkedReport, parseReport } from './report-parse';

const good = {
  id: 1, projectId: 2, trajectoryId: 3, trajectoryName: 'a.xyz', runId: 4, title: 'a', notes: '', analyses: ['msd'], params: {}, summary: {}, methods: {},
  engineVersion: '0.1.0', inputSha256: null, createdAt: '2026-01-01T00:00:00Z', curves: { msd: { columns: ['lag'], units: ['ps'], data: [[0]] } },
};

describe('parsing what the report routes answer', () => {
  it('when the report has its parts, then it is accepted as is', () => {
    expect(parseReport(good)).toBe(good);
    expect(parseLinkedReport({ report: good, expiresAt: '2026-02-01T00:00:00Z' }).report).toBe(good);
  });

  it('when a part is missing or malformed, then the page gets a plain error instead of a broken render', () => {
    expect(() => parseReport({ ...good, curves: { msd: { columns: 'lag' } } })).toThrow(/cannot read/);
    expect(() => parseReport({ ...good, summary: null })).toThrow(/cannot read/);
    expect(() => parseLinkedReport({ report: good })).toThrow(/cannot read/);
  });
});
