import { strFromU8, unzipSync } from 'fflate';
import { describe, expect, it } from 'vitest';
import type { ReportDto } from '../../../shared/report';
import { citationText, inTextCitation } from './citation-text';
import { reportBundle } from './report-bundle';

const report = {
  id: 41, projectId: 3, trajectoryId: 9, trajectoryName: 'larkspur-nacl-melt.extxyz', runId: 17, title: 'NaCl melt at 1200 K · MSD, g(r)', notes: '',
  analyses: ['msd', 'rdf'], params: {}, summary: {}, methods: {}, engineVersion: '0.3.1', inputSha256: 'c0ffee'.repeat(10) + 'beef',
  createdAt: '2026-05-07T14:03:00.000Z', curves: {},
} as ReportDto;

describe('the report bundle and its citation', () => {
  it('when a report is bundled, then one zip holds the JSON, the methods text, the citation, a guide and every curve as CSV, in one folder', () => {
    const zip = reportBundle(41, {
      reportJson: '{"report":{"id":41}}', methodsText: 'Mean-square displacement by FFT…', citationText: citationText(report),
      curves: { rdf: 'r (Å),g all\n1,0\n', msd: 'lag (ps),MSD all (Å²)\n0,0\n' },
    });
    const files = unzipSync(zip);
    expect(Object.keys(files).sort()).toEqual([
      'ergodic-report-41/README.txt', 'ergodic-report-41/citation.txt', 'ergodic-report-41/curves/msd.csv', 'ergodic-report-41/curves/rdf.csv',
      'ergodic-report-41/methods.txt', 'ergodic-report-41/report.json',
    ]);
    expect(strFromU8(files['ergodic-report-41/curves/msd.csv']!)).toBe('lag (ps),MSD all (Å²)\n0,0\n');
    expect(JSON.parse(strFromU8(files['ergodic-report-41/report.json']!))).toEqual({ report: { id: 41 } });
    expect(strFromU8(files['ergodic-report-41/README.txt']!)).toContain('curves/rdf.csv');
    expect(strFromU8(files['ergodic-report-41/citation.txt']!)).toContain('analysis report 41');
  });

  it('when a citation is written, then it names product, version, report number, title, date, input checksum and where the methods are', () => {
    const text = citationText(report);
    expect(text).toBe(
      `Ergodic 0.3.1, analysis report 41, “NaCl melt at 1200 K · MSD, g(r)”, computed 2026-05-07 from the trajectory larkspur-nacl-melt.extxyz, SHA-256 ${report.inputSha256}. ` +
      'Analyses: MSD, g(r). Methods and parameters as stated in the methods text of report 41, which travels with its exported data.',
    );
    expect(citationText({ ...report, inputSha256: null })).not.toContain('SHA-256');
    expect(inTextCitation(report)).toBe('(Ergodic 0.3.1, report 41)');
  });
});
