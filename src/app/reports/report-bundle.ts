import { strToU8, zipSync } from 'fflate';

/** What one report's bundle holds, as text files by name. */
export interface ReportBundleFiles {
  reportJson: string;
  methodsText: string;
  citationText: string;
  /** CSV text by curve name. */
  curves: Record<string, string>;
}

/** The folder every file of the bundle sits in, so unpacking several reports keeps them apart. */
export function bundleFolder(reportId: number): string {
  return `ergodic-report-${reportId}`;
}

/**
 * One zip with everything a paper's supplement needs from a report: the
 * report as JSON, the methods text, how to cite it, and one CSV per curve,
 * with a short guide to the files first.
 */
export function reportBundle(reportId: number, files: ReportBundleFiles): Uint8Array {
  const folder = bundleFolder(reportId);
  const curveNames = Object.keys(files.curves).sort();
  const guide = [
    `Ergodic report ${reportId}: the files in this folder`,
    '',
    'report.json   the whole report: settings, headline numbers with units, curves, methods record',
    'methods.txt   how the numbers were obtained, worded for a methods section',
    'citation.txt  how to cite this report',
    ...curveNames.map((name) => `curves/${name}.csv`.padEnd(14) + `the ${name} curve, one column per quantity, units in the header`),
    '',
  ].join('\n');
  const entries: Record<string, Uint8Array> = {
    [`${folder}/README.txt`]: strToU8(guide),
    [`${folder}/report.json`]: strToU8(files.reportJson),
    [`${folder}/methods.txt`]: strToU8(files.methodsText),
    [`${folder}/citation.txt`]: strToU8(files.citationText),
  };
  for (const name of curveNames) entries[`${folder}/curves/${name}.csv`] = strToU8(files.curves[name]!);
  return zipSync(entries, { level: 6, mtime: new Date('2026-01-01T00:00:00Z') });
}
