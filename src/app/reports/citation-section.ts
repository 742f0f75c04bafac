import { Clipboard } from '@angular/cdk/clipboard';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import type { ReportDto } from '../../../shared/report';
import { citationText, inTextCitation } from './citation-text';

/** How to cite the report, ready to paste. */
@Component({
  selector: 'erg-citation-section',
  imports: [MatButtonModule, MatIconModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="citation" aria-labelledby="citation-heading">
      <header>
        <h2 id="citation-heading">How to cite</h2>
        <button mat-stroked-button type="button" (click)="copy()"><mat-icon aria-hidden="true">content_copy</mat-icon> Copy citation</button>
        <span class="copied" role="status" aria-live="polite">{{ copied() ? 'Copied to the clipboard.' : '' }}</span>
      </header>
      <p class="text">{{ text() }}</p>
      <p class="short">In running text: {{ short() }}</p>
    </section>
  `,
  styles: `
    .citation { padding: 16px 20px; border-radius: 16px; border: 1px solid var(--mat-sys-outline-variant); }
    header { display: flex; align-items: center; gap: 16px; flex-wrap: wrap; }
    h2 { margin: 0; font: var(--mat-sys-title-large); }
    .text { max-width: 95ch; font: var(--mat-sys-body-medium); line-height: 1.55; overflow-wrap: anywhere; }
    .short { margin: 0; font: var(--mat-sys-body-small); color: var(--mat-sys-on-surface-variant); }
    .copied { color: var(--mat-sys-primary); font: var(--mat-sys-body-small); }
  `,
})
export class CitationSection {
  private readonly clipboard = inject(Clipboard);
  readonly report = input.required<ReportDto>();

  protected readonly text = computed(() => citationText(this.report()));
  protected readonly short = computed(() => inTextCitation(this.report()));
  protected readonly copied = signal(false);

  protected copy(): void {
    this.copied.set(this.clipboard.copy(this.text()));
  }
}
