import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { linkState, revocationWords, type LinkRow } from './link-state';

/** Every link ever made for a report or a series, newest first, with revoke on the ones still working. */
@Component({
  selector: 'erg-access-links-list',
  imports: [DatePipe, MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (rows().length === 0) {
      <p class="muted" role="status">No access links yet.</p>
    } @else {
      <ul class="links" aria-label="Access links">
        @for (row of rows(); track row.link.id) {
          <li [class.inactive]="row.state !== 'active'">
            <div>
              <span class="state-tag">{{ stateWords[row.state] }}</span>
              <span>made by {{ row.link.createdBy }} on {{ row.link.createdAt | date: 'mediumDate' }}</span>
              <span class="muted">
                · {{ row.state === 'revoked' ? revocationWords(row.link) + ' ' + (row.link.revokedAt | date: 'mediumDate') : (row.state === 'expired' ? 'expired ' : 'expires ') + (row.link.expiresAt | date: 'medium') }}
                · {{ row.link.lastUsedAt ? 'last opened ' + (row.link.lastUsedAt | date: 'medium') : 'never opened' }}
              </span>
            </div>
            @if (row.state === 'active') {
              <button mat-button type="button" [disabled]="busyId() === row.link.id" (click)="revoke.emit(row.link)" [attr.aria-label]="'Revoke the link made on ' + (row.link.createdAt | date: 'medium')">Revoke</button>
            }
          </li>
        }
      </ul>
    }
  `,
  styles: `
    .links { list-style: none; margin: 0; padding: 0; display: flex; flex-direction: column; gap: 6px; }
    li { display: flex; justify-content: space-between; align-items: center; gap: 8px; padding: 6px 10px; border-radius: 10px; background: var(--mat-sys-surface-container); font: var(--mat-sys-body-small); }
    li.inactive { background: transparent; color: var(--mat-sys-on-surface-variant); }
    .state-tag { font-weight: 600; margin-right: 6px; }
  `,
})
export class AccessLinksList {
  readonly links = input.required<LinkRow[]>();
  readonly busyId = input<number | null>(null);
  readonly revoke = output<LinkRow>();

  protected readonly stateWords = { active: 'Active', expired: 'Expired', revoked: 'Revoked' } as const;
  protected readonly revocationWords = revocationWords;
  protected readonly rows = computed(() => this.links().map((link) => ({ link, state: linkState(link) })));
}
