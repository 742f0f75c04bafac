import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';

/** The atom the user picked, as shown in the side panel. */
export interface SelectedAtom {
  /** 0-based index in the trajectory's atom order. */
  index: number;
  species: string;
  /** Position in Å in the frame on screen. */
  position: readonly [number, number, number];
  /** 0-based frame the position belongs to. */
  frame: number;
}

@Component({
  selector: 'erg-selected-atom-panel',
  imports: [DecimalPipe, MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section aria-labelledby="selected-atom-heading">
      <h2 id="selected-atom-heading">Selected atom</h2>
      <p class="visually-hidden" role="status">{{ announcement() }}</p>
      @if (atom(); as a) {
        <dl>
          <dt>Species</dt><dd>{{ a.species }}</dd>
          <dt>Atom number</dt><dd>{{ a.index + 1 }} <span class="base">(counting from 1)</span></dd>
          <dt>Index</dt><dd>{{ a.index }} <span class="base">(counting from 0)</span></dd>
          <dt>x</dt><dd>{{ a.position[0] | number: '1.3-3' }} Å</dd>
          <dt>y</dt><dd>{{ a.position[1] | number: '1.3-3' }} Å</dd>
          <dt>z</dt><dd>{{ a.position[2] | number: '1.3-3' }} Å</dd>
        </dl>
        <p class="hint">Position in frame {{ a.frame + 1 }}.</p>
        <button mat-button type="button" (click)="clear.emit()">Clear selection</button>
      } @else {
        <p class="hint">Click an atom to see its species, number and position.</p>
      }
    </section>
  `,
  styleUrl: './viewer-panel.scss',
  styles: `.base { color: var(--mat-sys-on-surface-variant); font: var(--mat-sys-body-small); }`,
})
export class SelectedAtomPanel {
  readonly atom = input.required<SelectedAtom | null>();
  readonly clear = output<void>();

  // Announced only when the selection changes, not on every frame of playback.
  protected readonly announcement = computed(() => {
    const a = this.atom();
    return a ? `Selected ${a.species} atom number ${a.index + 1}.` : 'No atom selected.';
  });
}
