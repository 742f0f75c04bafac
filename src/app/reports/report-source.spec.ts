import { describe, expect, it } from 'vitest';
import { curveCsvUrl, reportJsonUrl } from './report-source';

describe('report download addresses', () => {
  it('when a member reads, then downloads go through the report routes', () => {
    expect(curveCsvUrl({ kind: 'member', reportId: 12 }, 'msd')).toBe('/api/reports/12/curves/msd.csv');
    expect(reportJsonUrl({ kind: 'member', reportId: 12 })).toBe('/api/reports/12/export.json');
  });

  it('when a link holder reads, then downloads go through the link routes, the token escaped', () => {
    expect(curveCsvUrl({ kind: 'link', token: 'a/b c' }, 'rdf')).toBe('/api/links/a%2Fb%20c/curves/rdf.csv');
    expect(reportJsonUrl({ kind: 'link', token: 'tok' })).toBe('/api/links/tok/export.json');
  });
});
