import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { firstValueFrom } from 'rxjs';
import type { ReportDto } from '../../../shared/report';
import { SIMULATION_CAUTION } from '../../../shared/simulation-caution';
import { citationText } from './citation-text';
import { methodsParagraphs, methodsPlainText } from './methods-text';
import { bundleFolder, reportBundle } from './report-bundle';
import { curveCsvUrl, reportJsonUrl, type ReportSource } from './report-source';
import { saveFile } from './save-file';

/** Gathers a report's files through the routes its reader may use and hands over one zip. */
@Injectable({ providedIn: 'root' })
export class ReportBundleDownload {
  private readonly http = inject(HttpClient);

  async download(report: ReportDto, source: ReportSource): Promise<void> {
    const text = (url: string) => firstValueFrom(this.http.get(url, { responseType: 'text' }));
    const names = Object.keys(report.curves);
    const [reportJson, ...csvs] = await Promise.all([text(reportJsonUrl(source)), ...names.map((n) => text(curveCsvUrl(source, n)))]);
    const citation = citationText(report);
    const zip = reportBundle(report.id, {
      reportJson: reportJson!,
      methodsText: `${methodsPlainText(methodsParagraphs(report), SIMULATION_CAUTION)}\n`,
      citationText: `${citation}\n`,
      curves: Object.fromEntries(names.map((n, i) => [n, csvs[i]!])),
    });
    saveFile(`${bundleFolder(report.id)}.zip`, new Blob([zip as Uint8Array<ArrayBuffer>], { type: 'application/zip' }));
  }
}
