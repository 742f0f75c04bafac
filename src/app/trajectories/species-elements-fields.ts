import { ChangeDetectionStrategy, Component, computed, effect, input, output, signal } from '@angular/core';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { ELEMENTS } from '../../../shared/elements';
import type { SpeciesElement, SpeciesElementChoice } from '../../../shared/trajectory';

/** One species as the form edits it. */
interface Row {
  label: string;
  atoms: number;
  status: SpeciesElement['status'];
  element: string;
  mass: string;
  confirmed: boolean;
  /** The user typed a mass of their own, so a new element no longer replaces it. */
  massTyped: boolean;
  /** Anything changed here, so the row is sent. */
  touched: boolean;
}

const STATUS_WORDS: Record<SpeciesElement['status'], string> = {
  exact: 'symbol in the file',
  assumed: 'assumed: please confirm',
  unknown: 'unknown: give a mass',
  confirmed: 'confirmed',
};

/** Why an element text is refused, or null when it is a symbol (or empty, for a bead). */
export function elementProblem(text: string): string | null {
  const t = text.trim();
  if (t === '' || ELEMENTS.has(t)) return null;
  const cased = t[0]!.toUpperCase() + t.slice(1).toLowerCase();
  return ELEMENTS.has(cased) ? `Write it as "${cased}": case tells elements apart` : 'Not an element symbol';
}

/** Why a mass text is refused, or null. Empty is allowed only with an element. */
export function massProblem(text: string, element: string): string | null {
  if (text.trim() === '') return element.trim() ? null : 'A species without an element needs a mass';
  const m = Number(text);
  return Number.isFinite(m) && m > 0 && m <= 1e6 ? null : 'A mass above 0 u';
}

/**
 * Species → element and mass, as every analysis of the trajectory uses them.
 * Labels are read as elements only from symbols written case and all; the
 * rest are marked for the user to confirm or change here.
 */
@Component({
  selector: 'erg-species-elements-fields',
  imports: [MatFormFieldModule, MatInputModule, MatCheckboxModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <fieldset>
      <legend>Species and elements</legend>
      <p class="hint">
        A label counts as an element only when it is the symbol written exactly (“Ca” is calcium; “CA”, often an α-carbon, is read as carbon and marked assumed).
        Every analysis weighs atoms by these masses. Confirm or change what was assumed.
      </p>
      @for (r of rows(); track r.label; let i = $index) {
        <div class="row" [attr.data-species]="r.label">
          <div class="label">
            <span class="name">{{ r.label }}</span>
            <span class="count">{{ r.atoms }} atom{{ r.atoms === 1 ? '' : 's' }}</span>
            <span class="status" [class]="'status ' + (r.touched || r.confirmed && r.status !== 'exact' ? 'confirmed' : r.status)">{{ statusWords(r) }}</span>
          </div>
          <mat-form-field appearance="outline" class="element" subscriptSizing="dynamic">
            <mat-label>Element</mat-label>
            <input matInput [attr.aria-label]="'Element of ' + r.label" [value]="r.element" (input)="setElement(i, $any($event.target).value)" placeholder="none: a bead" autocomplete="off" spellcheck="false">
            @if (elementError(r); as e) { <mat-hint class="bad">{{ e }}</mat-hint> }
          </mat-form-field>
          <mat-form-field appearance="outline" class="mass" subscriptSizing="dynamic">
            <mat-label>Mass (u)</mat-label>
            <input matInput type="number" min="0" step="any" [attr.aria-label]="'Mass of ' + r.label + ' (u)'" [value]="r.mass" (input)="setMass(i, $any($event.target).value)">
            @if (massError(r); as e) { <mat-hint class="bad">{{ e }}</mat-hint> }
          </mat-form-field>
          @if (r.status !== 'exact') {
            <mat-checkbox class="confirm" [checked]="r.confirmed" (change)="setConfirmed(i, $event.checked)">Confirmed</mat-checkbox>
          } @else {
            <span class="confirm"></span>
          }
        </div>
      }
    </fieldset>
  `,
  styles: `
    fieldset { border: 1px solid var(--mat-sys-outline-variant); border-radius: 12px; padding: 8px 12px 0; margin: 0 0 12px; min-width: 0; }
    legend { padding: 0 4px; font: var(--mat-sys-title-small); }
    .hint { margin: 0 0 8px; color: var(--mat-sys-on-surface-variant); font: var(--mat-sys-body-small); }
    .row { display: grid; grid-template-columns: minmax(0, 1.1fr) minmax(0, 0.9fr) minmax(0, 1fr) 124px; gap: 4px 12px; align-items: start; padding: 4px 0 12px; }
    .label { display: flex; flex-direction: column; gap: 2px; padding-top: 6px; min-width: 0; }
    .name { font-weight: 600; overflow-wrap: anywhere; font-family: var(--erg-mono, monospace); }
    .count { color: var(--mat-sys-on-surface-variant); font: var(--mat-sys-body-small); }
    .status { align-self: flex-start; max-width: 100%; font-size: 11px; line-height: 16px; padding: 1px 8px; border-radius: 9px; }
    .status.exact { background: var(--mat-sys-surface-container-high); color: var(--mat-sys-on-surface-variant); }
    .status.assumed { background: var(--mat-sys-tertiary-container); color: var(--mat-sys-on-tertiary-container); }
    .status.unknown { background: var(--mat-sys-error-container); color: var(--mat-sys-on-error-container); }
    .status.confirmed { background: var(--mat-sys-secondary-container); color: var(--mat-sys-on-secondary-container); }
    .confirm { padding-top: 8px; }
    .bad { white-space: normal; }
    .bad { color: var(--mat-sys-error); }
    @media (max-width: 600px) {
      .row { grid-template-columns: minmax(0, 1fr) minmax(0, 1fr); border-top: 1px solid var(--mat-sys-outline-variant); padding-top: 8px; }
      .label { grid-column: 1 / -1; flex-direction: row; flex-wrap: wrap; align-items: center; gap: 8px; padding-top: 0; }
      .confirm { grid-column: 1 / -1; padding-top: 0; }
    }
  `,
})
export class SpeciesElementsFields {
  readonly speciesCounts = input.required<Record<string, number>>();
  readonly elements = input.required<Record<string, SpeciesElement>>();
  /** The rows to store, by label; null when nothing is to be sent. Emitted on every change. */
  readonly choicesChange = output<Record<string, SpeciesElementChoice> | null>();
  /** False while a row cannot be stored (not a symbol, no mass). */
  readonly validChange = output<boolean>();

  protected readonly rows = signal<Row[]>([]);
  protected readonly valid = computed(() => this.rows().every((r) => !this.elementError(r) && !this.massError(r)));

  constructor() {
    effect(() => {
      const counts = this.speciesCounts();
      const elements = this.elements();
      this.rows.set(Object.entries(counts).map(([label, atoms]) => {
        const e = elements[label] ?? { element: null, massU: null, status: 'unknown' as const };
        return {
          label, atoms, status: e.status, element: e.element ?? '', mass: e.massU === null ? '' : String(e.massU),
          confirmed: e.status === 'exact' || e.status === 'confirmed', massTyped: false, touched: false,
        };
      }));
    });
  }

  protected statusWords(r: Row): string {
    return r.touched && r.confirmed ? 'confirmed' : r.touched ? 'changed: tick Confirmed to keep' : STATUS_WORDS[r.status];
  }

  protected elementError(r: Row): string | null {
    return elementProblem(r.element);
  }

  protected massError(r: Row): string | null {
    return massProblem(r.mass, r.element);
  }

  protected setElement(i: number, text: string): void {
    this.update(i, (r) => {
      const symbol = text.trim();
      const standard = ELEMENTS.get(symbol)?.massU;
      return { ...r, element: text, mass: !r.massTyped && standard !== undefined ? String(standard) : r.mass, confirmed: true, touched: true };
    });
  }

  protected setMass(i: number, text: string): void {
    this.update(i, (r) => ({ ...r, mass: text, massTyped: true, confirmed: true, touched: true }));
  }

  protected setConfirmed(i: number, checked: boolean): void {
    this.update(i, (r) => ({ ...r, confirmed: checked, touched: true }));
  }

  private update(i: number, change: (r: Row) => Row): void {
    this.rows.update((rows) => rows.map((r, k) => (k === i ? change(r) : r)));
    this.emit();
  }

  /** Confirmed rows the user touched, as the API takes them. */
  private emit(): void {
    const out: Record<string, SpeciesElementChoice> = {};
    for (const r of this.rows()) {
      if (!r.touched || !r.confirmed || elementProblem(r.element) || massProblem(r.mass, r.element)) continue;
      const element = r.element.trim() || null;
      const choice: SpeciesElementChoice = { element };
      if (r.mass.trim() !== '') choice.massU = Number(r.mass);
      out[r.label] = choice;
    }
    this.validChange.emit(this.valid());
    this.choicesChange.emit(Object.keys(out).length ? out : null);
  }
}
