import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, input, output, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import type { SeriesDto, SeriesMemberDto } from '../../../shared/series-api';
import { SIMULATION_CAUTION } from '../../../shared/simulation-caution';
import { DIFFUSION_UNITS, type DiffusionUnit } from '../reports/report-units';
import { ArrheniusCard } from './arrhenius-card';
import { CaloricCard } from './caloric-card';
import { MembersTable, type MemberChange } from './members-table';
import { SeriesCharts } from './series-charts';
import { SeriesMethods } from './series-methods';
import { seriesJsonUrl, seriesMembersCsvUrl, type SeriesSource } from './series-source';
import { SERIES_STATUS_WORDS } from './series-status';
import { TransitionCard } from './transition-card';

/** A series as members and link holders read it; what they may change comes from the page around it. */
@Component({
  selector: 'erg-series-view',
  imports: [
    DatePipe, MatButtonModule, MatButtonToggleModule, MatIconModule, MatProgressBarModule, MatProgressSpinnerModule,
    ArrheniusCard, CaloricCard, MembersTable, SeriesCharts, SeriesMethods, TransitionCard,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './series-view.html',
  styleUrl: './series-view.scss',
})
export class SeriesView {
  readonly series = input.required<SeriesDto>();
  readonly source = input.required<SeriesSource>();
  readonly canEdit = input(false);
  readonly busyMemberId = input<number | null>(null);
  readonly memberChange = output<MemberChange>();
  readonly removeMember = output<SeriesMemberDto>();
  readonly addMembers = output<void>();
  readonly retryFailed = output<void>();

  protected readonly units = DIFFUSION_UNITS;
  protected readonly unit = signal<DiffusionUnit>('e9M2PerS');
  protected readonly statusWords = SERIES_STATUS_WORDS;
  protected readonly caution = computed(() => this.series().caution || SIMULATION_CAUTION);
  protected readonly results = computed(() => this.series().results);
  protected readonly isMember = computed(() => this.source().kind === 'member');
  protected readonly jsonHref = computed(() => seriesJsonUrl(this.source()));
  protected readonly membersCsvHref = computed(() => (this.source().kind === 'member' ? seriesMembersCsvUrl(this.series().id) : null));
  protected readonly fileStem = computed(() => `ergodic-series-${this.series().id}`);
  protected readonly failedCount = computed(() => this.series().members.filter((m) => m.status === 'failed' || m.status === 'cancelled').length);
  protected readonly done = computed(() => this.series().members.filter((m) => m.status === 'done').length);
  protected readonly overallProgress = computed(() => {
    const ms = this.series().members;
    return ms.length ? Math.round(ms.reduce((sum, m) => sum + (m.status === 'done' ? 100 : m.progress), 0) / ms.length) : 0;
  });
  protected readonly rangeText = computed(() => {
    const r = this.series().temperatureRangeK;
    return r ? `${Number(r.min.toPrecision(4))}–${Number(r.max.toPrecision(4))} K` : 'temperatures not known yet';
  });
}
