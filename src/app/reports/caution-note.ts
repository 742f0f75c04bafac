import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { SIMULATION_CAUTION } from '../../../shared/simulation-caution';

/** The same caution on every report, however it was opened. */
@Component({
  selector: 'erg-caution-note',
  imports: [MatIconModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <aside class="caution" role="note" aria-label="Caution">
      <mat-icon aria-hidden="true">science</mat-icon>
      <p><strong>Caution.</strong> {{ caution }}</p>
    </aside>
  `,
  styles: `
    .caution { display: flex; gap: 12px; align-items: flex-start; padding: 12px 16px; border-radius: 12px;
      background: var(--mat-sys-tertiary-container); color: var(--mat-sys-on-tertiary-container); }
    p { margin: 0; font: var(--mat-sys-body-medium); }
    mat-icon { flex: none; }
  `,
})
export class CautionNote {
  protected readonly caution = SIMULATION_CAUTION;
}
