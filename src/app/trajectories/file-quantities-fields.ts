import { ChangeDetectionStrategy, Component, input, model } from '@angular/core';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatSelectModule } from '@angular/material/select';
import { ENERGY_UNIT_LIST, PRESSURE_UNIT_LIST } from '../../../shared/energy-units';
import { FILE_QUANTITY_LABELS, type FileQuantities } from '../../../shared/file-quantities';

type Quantity = keyof FileQuantities;
const QUANTITIES: Quantity[] = ['potentialEnergy', 'totalEnergy', 'pressure', 'temperature'];

/** Which per-frame number of the file is which quantity, and in which unit. */
@Component({
  selector: 'erg-file-quantities-fields',
  imports: [MatFormFieldModule, MatSelectModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <fieldset>
      <legend>Numbers stored per frame in the file</legend>
      <p class="hint">The file carries {{ keys().join(', ') }}. Say which is which for the energy analysis; unmapped, a key named “energy” is read as the potential energy in eV.</p>
      @for (q of quantities; track q) {
        <div class="row">
          <mat-form-field appearance="outline">
            <mat-label>{{ labels[q] }}</mat-label>
            <mat-select [value]="value()?.[q]?.key ?? null" (selectionChange)="setKey(q, $event.value)">
              <mat-option [value]="null">Not in the file</mat-option>
              @for (k of keys(); track k) { <mat-option [value]="k">{{ k }}</mat-option> }
            </mat-select>
          </mat-form-field>
          @if (q !== 'temperature' && value()?.[q]) {
            <mat-form-field appearance="outline">
              <mat-label>Unit of {{ labels[q] }}</mat-label>
              <mat-select [value]="unitOf(q)" (selectionChange)="setUnit(q, $event.value)">
                @for (u of unitsFor(q); track u) { <mat-option [value]="u">{{ u }}</mat-option> }
              </mat-select>
            </mat-form-field>
          } @else if (q === 'temperature' && value()?.[q]) {
            <span class="fixed">kelvin</span>
          }
        </div>
      }
    </fieldset>
  `,
  styles: `
    fieldset { border: 1px solid var(--mat-sys-outline-variant); border-radius: 12px; padding: 8px 12px 0; margin: 0 0 12px; }
    legend { padding: 0 4px; font: var(--mat-sys-title-small); }
    .hint { margin: 0 0 8px; color: var(--mat-sys-on-surface-variant); font: var(--mat-sys-body-small); }
    .row { display: flex; gap: 12px; flex-wrap: wrap; align-items: center; }
    .row mat-form-field { flex: 1 1 200px; }
    .fixed { color: var(--mat-sys-on-surface-variant); }
  `,
})
export class FileQuantitiesFields {
  readonly keys = input.required<string[]>();
  readonly value = model<FileQuantities | null>(null);
  protected readonly quantities = QUANTITIES;
  protected readonly labels = FILE_QUANTITY_LABELS;

  protected unitsFor(q: Quantity): readonly string[] {
    return q === 'pressure' ? PRESSURE_UNIT_LIST : ENERGY_UNIT_LIST;
  }

  protected unitOf(q: Quantity): string {
    const entry = this.value()?.[q] as { unit?: string } | undefined;
    return entry?.unit ?? (q === 'pressure' ? 'bar' : 'eV');
  }

  protected setKey(q: Quantity, key: string | null): void {
    const next: Record<string, unknown> = { ...(this.value() ?? {}) };
    if (key === null) delete next[q];
    else next[q] = q === 'temperature' ? { key } : { key, unit: this.unitOf(q) };
    this.value.set(Object.keys(next).length ? (next as FileQuantities) : null);
  }

  protected setUnit(q: Quantity, unit: string): void {
    const entry = this.value()?.[q];
    if (!entry) return;
    this.value.set({ ...(this.value() ?? {}), [q]: { ...entry, unit } } as FileQuantities);
  }
}
