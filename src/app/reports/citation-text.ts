import { analysesText } from '../../../shared/analysis-labels';
import type { ReportDto } from '../../../shared/report';

/**
 * How to cite a report in a paper or a lab notebook: the product and the
 * version that computed it, the report's number, title and date, the input
 * file with its checksum, and where the methods are written out. Ergodic's
 * own wording; one paragraph, so it pastes anywhere.
 */
export function citationText(report: ReportDto): string {
  const day = report.createdAt.slice(0, 10);
  const checksum = report.inputSha256 ? `, SHA-256 ${report.inputSha256}` : '';
  return `Ergodic ${report.engineVersion}, analysis report ${report.id}, “${report.title}”, computed ${day} ` +
    `from the trajectory ${report.trajectoryName}${checksum}. ` +
    `Analyses: ${analysesText(report.analyses)}. ` +
    `Methods and parameters as stated in the methods text of report ${report.id}, which travels with its exported data.`;
}

/** A short form for running text: product, version and report number. */
export function inTextCitation(report: ReportDto): string {
  return `(Ergodic ${report.engineVersion}, report ${report.id})`;
}
