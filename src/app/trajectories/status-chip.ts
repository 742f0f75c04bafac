import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';

/** A trajectory's or job's state as a small coloured label. */
@Component({
  selector: 'erg-status-chip',
  imports: [MatProgressSpinnerModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <span class="chip" [class]="'chip ' + status()" [attr.title]="detail() || null">
      @if (status() === 'inspecting' || status() === 'uploading' || status() === 'running' || status() === 'queued') {
        <mat-spinner diameter="12" strokeWidth="2" aria-hidden="true" />
      }
      {{ status() }}
    </span>
  `,
  styles: `
    .chip { display: inline-flex; align-items: center; gap: 6px; padding: 2px 10px; border-radius: 999px; font-size: 12px; font-weight: 500;
            background: var(--mat-sys-surface-container-high); color: var(--mat-sys-on-surface-variant); text-transform: capitalize; }
    .chip.ready, .chip.done { background: var(--mat-sys-primary-container); color: var(--mat-sys-on-primary-container); }
    .chip.failed { background: var(--mat-sys-error-container); color: var(--mat-sys-on-error-container); }
    .chip.cancelled { background: var(--mat-sys-surface-container-highest); }
    .chip.running, .chip.inspecting { background: var(--mat-sys-tertiary-container); color: var(--mat-sys-on-tertiary-container); }
  `,
})
export class StatusChip {
  readonly status = input.required<string>();
  readonly detail = input<string | null>(null);
}
