import { Clipboard } from '@angular/cdk/clipboard';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import type { ReportDto } from '../../../shared/report';
import { SIMULATION_CAUTION } from '../../../shared/simulation-caution';
import { methodsParagraphs, methodsPlainText } from './methods-text';

/** How the numbers were obtained, worded for a paper's methods section, with a copy button. */
@Component({
  selector: 'erg-methods-section',
  imports: [MatButtonModule, MatIconModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="methods" aria-labelledby="methods-heading">
      <header>
        <h2 id="methods-heading">Methods</h2>
        <button mat-stroked-button type="button" (click)="copy()"><mat-icon aria-hidden="true">content_copy</mat-icon> Copy methods text</button>
        <span class="copied" role="status" aria-live="polite">{{ copied() ? 'Copied to the clipboard.' : '' }}</span>
      </header>
      @for (p of paragraphs(); track p.heading) {
        <p><strong>{{ p.heading }}.</strong> {{ p.body }}</p>
      }
    </section>
  `,
  styles: `
    .methods { padding: 16px 20px; border-radius: 16px; background: var(--mat-sys-surface-container-low); }
    header { display: flex; align-items: center; gap: 16px; flex-wrap: wrap; }
    h2 { margin: 0; }
    p { max-width: 95ch; font: var(--mat-sys-body-medium); line-height: 1.55; overflow-wrap: anywhere; }
    .copied { color: var(--mat-sys-primary); font: var(--mat-sys-body-small); }
  `,
})
export class MethodsSection {
  private readonly clipboard = inject(Clipboard);
  readonly report = input.required<ReportDto>();

  protected readonly paragraphs = computed(() => methodsParagraphs(this.report()));
  protected readonly copied = signal(false);

  protected copy(): void {
    this.copied.set(this.clipboard.copy(methodsPlainText(this.paragraphs(), SIMULATION_CAUTION)));
  }
}
