import { Clipboard } from '@angular/cdk/clipboard';
import { ChangeDetectionStrategy, Component, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';

/** How the series' numbers were obtained, worded for a paper's methods section, with a copy button. */
@Component({
  selector: 'erg-series-methods',
  imports: [MatButtonModule, MatIconModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="methods" aria-labelledby="series-methods-heading">
      <header>
        <h2 id="series-methods-heading">Methods</h2>
        <button mat-stroked-button type="button" (click)="copy()"><mat-icon aria-hidden="true">content_copy</mat-icon> Copy methods text</button>
        <span class="copied" role="status" aria-live="polite">{{ copied() ? 'Copied to the clipboard.' : '' }}</span>
      </header>
      @for (p of paragraphs(); track $index) {
        <p>{{ p }}</p>
      } @empty {
        <p class="muted">The methods text appears once the members have been analysed.</p>
      }
      <p><strong>Caution.</strong> {{ caution() }}</p>
    </section>
  `,
  styles: `
    .methods { padding: 16px 20px; border-radius: 16px; background: var(--mat-sys-surface-container-low); }
    header { display: flex; align-items: center; gap: 16px; flex-wrap: wrap; }
    h2 { margin: 0; font: var(--mat-sys-title-large); }
    p { max-width: 95ch; font: var(--mat-sys-body-medium); line-height: 1.55; overflow-wrap: anywhere; }
    .copied { color: var(--mat-sys-primary); font: var(--mat-sys-body-small); }
  `,
})
export class SeriesMethods {
  private readonly clipboard = inject(Clipboard);
  readonly paragraphs = input.required<string[]>();
  readonly caution = input.required<string>();

  protected readonly copied = signal(false);

  protected copy(): void {
    this.copied.set(this.clipboard.copy([...this.paragraphs(), `Caution. ${this.caution()}`].join('\n\n')));
  }
}
