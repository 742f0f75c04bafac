import { ChangeDetectionStrategy, Component } from '@angular/core';

/** Ergodic's mark: a random walk inside a box. */
@Component({
  selector: 'erg-logo',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <svg viewBox="0 0 32 32" width="28" height="28" aria-hidden="true">
      <rect x="2" y="2" width="28" height="28" rx="5" fill="var(--mat-sys-surface-container-lowest)" stroke="var(--mat-sys-primary)" stroke-width="2.5"/>
      <polyline points="8,22 12,14 15,19 19,9 22,16 25,11" fill="none" stroke="var(--mat-sys-tertiary)" stroke-width="2.2" stroke-linecap="round" stroke-linejoin="round"/>
      <circle cx="25" cy="11" r="2.2" fill="var(--mat-sys-primary)"/>
    </svg>
  `,
  styles: `:host { display: inline-flex; }`,
})
export class Logo {}
