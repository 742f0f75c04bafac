import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { MatChipListboxChange, MatChipsModule } from '@angular/material/chips';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { MAX_PATH_FRAMES } from './scene/selection-marker';

/** One species as the display panel lists it. */
export interface SpeciesEntry {
  /** Index into the system's species list. */
  index: number;
  name: string;
  count: number;
  colour: string;
  visible: boolean;
}

/** What is drawn: species, the periodic cell, the selected atom's path. */
@Component({
  selector: 'erg-display-panel',
  imports: [DecimalPipe, MatChipsModule, MatFormFieldModule, MatInputModule, MatSlideToggleModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section aria-labelledby="display-heading">
      <h2 id="display-heading">Display</h2>
      <mat-chip-listbox multiple aria-label="Species shown" (change)="changeSpecies($event)">
        @for (s of species(); track s.index) {
          <mat-chip-option [value]="s.index" [selected]="s.visible" [aria-label]="s.name + ', ' + s.count + ' atoms'">
            <span class="swatch" [style.background]="s.colour" aria-hidden="true"></span>
            {{ s.name }} <span class="count">{{ s.count | number }}</span>
          </mat-chip-option>
        }
      </mat-chip-listbox>
      <mat-slide-toggle [checked]="showCell()" [disabled]="!hasCell()" (change)="showCellChange.emit($event.checked)">
        Periodic cell
      </mat-slide-toggle>
      @if (loaded() && !hasCell()) { <p class="hint">This frame states no cell.</p> }
      <mat-slide-toggle [checked]="showPath()" (change)="showPathChange.emit($event.checked)">
        Path of the selected atom
      </mat-slide-toggle>
      <mat-form-field class="path-length" subscriptSizing="dynamic">
        <mat-label>Path length (frames)</mat-label>
        <input matInput type="number" min="2" [max]="maxPath" step="1" [value]="pathLength()" [disabled]="!showPath()"
               (change)="changePathLength($event)" />
      </mat-form-field>
    </section>
  `,
  styleUrl: './viewer-panel.scss',
  styles: `
    section { display: flex; flex-direction: column; gap: 8px; }
    .swatch { display: inline-block; width: 12px; height: 12px; border-radius: 50%; margin-right: 6px;
      border: 1px solid var(--mat-sys-outline); vertical-align: -1px; }
    .count { color: var(--mat-sys-on-surface-variant); margin-left: 4px; font-variant-numeric: tabular-nums; }
    .path-length { width: 100%; }
  `,
})
export class DisplayPanel {
  readonly species = input.required<readonly SpeciesEntry[]>();
  readonly showCell = input.required<boolean>();
  /** False until a frame has arrived, when whether it has a cell is not known yet. */
  readonly loaded = input.required<boolean>();
  readonly hasCell = input.required<boolean>();
  readonly showPath = input.required<boolean>();
  readonly pathLength = input.required<number>();

  readonly visibleSpeciesChange = output<ReadonlySet<number>>();
  readonly showCellChange = output<boolean>();
  readonly showPathChange = output<boolean>();
  readonly pathLengthChange = output<number>();

  protected readonly maxPath = MAX_PATH_FRAMES;

  protected changeSpecies(event: MatChipListboxChange): void {
    const selected: unknown = event.value;
    const indices = Array.isArray(selected) ? selected.filter((v): v is number => typeof v === 'number') : [];
    this.visibleSpeciesChange.emit(new Set(indices));
  }

  protected changePathLength(event: Event): void {
    const value = (event.target as HTMLInputElement).valueAsNumber;
    if (Number.isFinite(value)) this.pathLengthChange.emit(Math.min(MAX_PATH_FRAMES, Math.max(2, Math.round(value))));
  }
}
