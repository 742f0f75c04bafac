import { BreakpointObserver } from '@angular/cdk/layout';
import { NgTemplateOutlet } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, output } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatTooltipModule } from '@angular/material/tooltip';
import { RouterLink } from '@angular/router';
import { map } from 'rxjs';
import type { MemberStatus, SeriesMemberDto } from '../../../shared/series-api';
import type { Branch, SeriesResults } from '../../../shared/series-results';
import { diffusionLabel, type DiffusionUnit } from '../reports/report-units';
import { memberRows } from './member-rows';
import { PhaseEvidence } from './phase-evidence';
import { MEMBER_STATUS_WORDS } from './series-status';

/** Below this width each member becomes a card. */
const NARROW = '(max-width: 899.98px)';

export interface MemberChange {
  trajectoryId: number;
  excludedFromFit?: boolean;
  branch?: Branch | null;
}

/**
 * The series' members in order: state point (stated and measured T, density,
 * pressure), D, the phase with the evidence behind it, analysis progress;
 * editors exclude members from fits, set their branch and remove them.
 */
@Component({
  selector: 'erg-members-table',
  imports: [NgTemplateOutlet, RouterLink, MatButtonModule, MatCheckboxModule, MatIconModule, MatProgressBarModule, MatSelectModule, MatTooltipModule, PhaseEvidence],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './members-table.html',
  styleUrl: './members-table.scss',
})
export class MembersTable {
  readonly members = input.required<SeriesMemberDto[]>();
  readonly results = input.required<SeriesResults | null>();
  readonly unit = input.required<DiffusionUnit>();
  readonly canEdit = input(false);
  /** Links to members' reports only for project members (a link holder cannot open them). */
  readonly linkReports = input(false);
  /** The member whose change is being saved. */
  readonly busyId = input<number | null>(null);
  readonly change = output<MemberChange>();
  readonly remove = output<SeriesMemberDto>();

  protected readonly narrow = toSignal(inject(BreakpointObserver).observe(NARROW).pipe(map((s) => s.matches)), { initialValue: false });
  protected readonly rows = computed(() => memberRows(this.members(), this.results(), this.unit()));
  protected readonly dLabel = computed(() => diffusionLabel(this.unit()));
  protected readonly canRemove = computed(() => this.canEdit() && this.members().length > 2);
  protected statusText(status: MemberStatus): string {
    return MEMBER_STATUS_WORDS[status];
  }

  protected readonly columnCount = computed(() => (this.canEdit() ? 10 : 9));
}
