import { DatePipe } from '@angular/common';
import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { RouterLink } from '@angular/router';
import { seriesListItemSchema, type SeriesListItem } from '../../../shared/series-api';
import { unwrapList } from '../core/api-envelope';
import { apiErrorMessage } from '../core/api-error';
import { formatNumber, formatWithError } from '../reports/number-format';
import { SERIES_STATUS_WORDS } from './series-status';

/** The project's series, each with its temperature range and what it has found so far. */
@Component({
  selector: 'erg-project-series',
  imports: [DatePipe, RouterLink, MatButtonModule, MatIconModule, MatProgressSpinnerModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="series" aria-labelledby="project-series-heading">
      <h2 id="project-series-heading">Series</h2>
      @if (list.isLoading() && !list.hasValue()) {
        <div class="state"><mat-spinner diameter="24" aria-label="Loading series" /></div>
      } @else if (list.error()) {
        <div class="state" role="alert">
          <mat-icon aria-hidden="true">error</mat-icon>
          <span>{{ loadError() }}</span>
          <button mat-button type="button" (click)="list.reload()">Try again</button>
        </div>
      } @else if (rows().length === 0) {
        <p class="muted" role="status">No series yet. Tick two or more trajectories of one system in the table above and choose “Compare” to study them across temperature.</p>
      } @else {
        <ul class="list" aria-label="Series in this project">
          @for (s of rows(); track s.id) {
            <li>
              <a [routerLink]="['/series', s.id]" class="title">{{ s.name }}</a>
              <span class="status" [class.running]="s.status === 'running'">{{ statusWords[s.status] }}</span>
              <span class="meta">{{ s.memberCount }} members{{ rangeText(s) }}{{ s.createdBy ? ' · ' + s.createdBy.displayName : '' }} · {{ s.updatedAt | date: 'medium' }}</span>
              @if (findings(s).length) {
                <span class="numbers" aria-label="Findings">
                  @for (f of findings(s); track f) { <span>{{ f }}</span> }
                </span>
              }
            </li>
          }
        </ul>
      }
    </section>
  `,
  styles: `
    h2 { margin: 0 0 8px; font: var(--mat-sys-title-large); }
    .list { list-style: none; margin: 0; padding: 0; }
    li { display: grid; grid-template-columns: minmax(0, 1fr) auto; gap: 4px 16px; padding: 10px 4px; border-bottom: 1px solid var(--mat-sys-outline-variant); }
    .title { color: var(--mat-sys-primary); font-weight: 500; overflow-wrap: anywhere; }
    .status { justify-self: end; padding: 2px 8px; border-radius: 8px; font: var(--mat-sys-label-small); background: var(--mat-sys-surface-container-high); }
    .status.running { background: var(--mat-sys-secondary-container); color: var(--mat-sys-on-secondary-container); }
    .meta, .numbers { grid-column: 1 / -1; }
    .meta { font: var(--mat-sys-body-small); color: var(--mat-sys-on-surface-variant); overflow-wrap: anywhere; }
    .numbers { display: flex; flex-wrap: wrap; gap: 4px 16px; font: var(--mat-sys-body-medium); font-variant-numeric: tabular-nums; }
  `,
})
export class ProjectSeries {
  readonly projectId = input.required<number>();

  protected readonly statusWords = SERIES_STATUS_WORDS;
  protected readonly list = httpResource(() => `/api/projects/${this.projectId()}/series`, { parse: unwrapList('series', seriesListItemSchema) });
  protected readonly rows = computed(() => this.list.value() ?? []);

  protected rangeText(s: SeriesListItem): string {
    const r = s.temperatureRangeK;
    return r ? ` · ${formatNumber(r.min, 4)}–${formatNumber(r.max, 4)} K` : '';
  }

  protected findings(s: SeriesListItem): string[] {
    const out: string[] = [];
    if (s.activationEnergy) out.push(`E_a = ${formatWithError(s.activationEnergy.kJPerMol, s.activationEnergy.kJPerMolStdError)} kJ/mol`);
    if (s.meltingBracketK) out.push(`melts between ${formatNumber(s.meltingBracketK.belowK, 4)} and ${formatNumber(s.meltingBracketK.aboveK, 4)} K`);
    return out;
  }

  protected loadError(): string {
    return apiErrorMessage(this.list.error(), 'The series could not be loaded.');
  }
}
