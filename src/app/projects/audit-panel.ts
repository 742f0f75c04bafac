import { DatePipe } from '@angular/common';
import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, effect, input, untracked } from '@angular/core';
import { MatListModule } from '@angular/material/list';
import { apiErrorMessage } from '../core/api-error';
import { describeAuditEntry } from './audit-wording';
import { auditEntrySchema } from '../../../shared/projects';
import { unwrapList } from '../core/api-envelope';

/** Who changed membership, roles, invitations and access links (owners only). */
@Component({
  selector: 'erg-audit-panel',
  imports: [DatePipe, MatListModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (audit.error()) {
      <p class="form-error" role="alert">{{ loadError() }}</p>
    } @else if (entries().length === 0) {
      <p class="muted">{{ audit.isLoading() ? 'Loading…' : 'Nothing recorded yet.' }}</p>
    } @else {
      <mat-list role="list" aria-label="Audit log">
        @for (entry of entries(); track entry.id) {
          <mat-list-item role="listitem">
            <span matListItemTitle>{{ entry.actor?.displayName ?? 'Someone' }} {{ describe(entry) }}</span>
            <span matListItemLine class="muted">{{ entry.createdAt | date: 'medium' }}</span>
          </mat-list-item>
        }
      </mat-list>
    }
  `,
})
export class AuditPanel {
  readonly projectId = input.required<number>();
  /** Raised by the page after each change it made, so the log shows it without a reload. */
  readonly revision = input(0);
  protected readonly audit = httpResource(() => `/api/projects/${this.projectId()}/audit`, { parse: unwrapList('entries', auditEntrySchema) });
  protected readonly entries = computed(() => this.audit.value() ?? []);
  protected readonly describe = describeAuditEntry;

  constructor() {
    effect(() => {
      if (this.revision() > 0) untracked(() => this.audit.reload());
    });
  }

  protected loadError(): string {
    return apiErrorMessage(this.audit.error(), 'The audit log could not be loaded.');
  }
}
