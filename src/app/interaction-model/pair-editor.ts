import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { ENERGY_UNIT_LIST, SUFFIX_LABELS, type EnergySuffix, type LengthSuffix } from '../../../shared/energy-units';
import { PAIR_FORMS, TRUNCATIONS, type PairForm } from '../../../shared/interaction-model';
import { FORM_LABELS, PARAMETERS, resolvedDraftPair, type PairDraft } from './pair-drafts';
import { PotentialPlot } from './potential-plot';

const TRUNCATION_LABELS: Record<string, string> = { truncated: 'Truncated', shifted: 'Shifted (U = 0 at cut-off)', 'force-shifted': 'Force-shifted (U and F = 0)' };

/** One species pair: form, parameters with their units, cut-off convention, the problems found, and U(r). */
@Component({
  selector: 'erg-pair-editor',
  imports: [MatFormFieldModule, MatInputModule, MatSelectModule, MatCheckboxModule, MatButtonModule, MatIconModule, PotentialPlot],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="pair" [attr.aria-label]="'Pair ' + (index() + 1)">
      <header>
        <h3>Pair {{ index() + 1 }}@if (draft().a || draft().b) {: {{ draft().a || '?' }}–{{ draft().b || '?' }}}</h3>
        <button mat-icon-button type="button" (click)="remove.emit()" [attr.aria-label]="'Remove pair ' + (index() + 1)"><mat-icon>delete</mat-icon></button>
      </header>
      <div class="fields">
        <mat-form-field appearance="outline" subscriptSizing="dynamic" class="short">
          <mat-label>Species</mat-label>
          <input matInput [value]="draft().a" (input)="set({ a: value($event) })" aria-label="First species">
        </mat-form-field>
        <mat-form-field appearance="outline" subscriptSizing="dynamic" class="short">
          <mat-label>with species</mat-label>
          <input matInput [value]="draft().b" (input)="set({ b: value($event) })" aria-label="Second species">
        </mat-form-field>
        <mat-form-field appearance="outline" subscriptSizing="dynamic">
          <mat-label>Form</mat-label>
          <mat-select [value]="draft().form" (selectionChange)="set({ form: $event.value })">
            @for (f of forms; track f) { <mat-option [value]="f">{{ formLabels[f] }}</mat-option> }
          </mat-select>
        </mat-form-field>
        @if (draft().form !== 'none') {
          @if (draft().form !== 'table') {
            <mat-form-field appearance="outline" subscriptSizing="dynamic" class="short">
              <mat-label>Energy unit</mat-label>
              <mat-select [value]="draft().energy" (selectionChange)="set({ energy: $event.value })">
                @for (e of energySuffixes; track e) { <mat-option [value]="e">{{ suffixLabels[e] }}</mat-option> }
              </mat-select>
            </mat-form-field>
          } @else {
            <mat-form-field appearance="outline" subscriptSizing="dynamic" class="short">
              <mat-label>U unit in the table</mat-label>
              <mat-select [value]="draft().tableUnit" (selectionChange)="set({ tableUnit: $event.value })">
                @for (e of energyUnits; track e) { <mat-option [value]="e">{{ e }}</mat-option> }
              </mat-select>
            </mat-form-field>
          }
          <mat-form-field appearance="outline" subscriptSizing="dynamic" class="short">
            <mat-label>Length unit</mat-label>
            <mat-select [value]="draft().length" (selectionChange)="set({ length: $event.value })">
              @for (l of lengthSuffixes; track l) { <mat-option [value]="l">{{ suffixLabels[l] }}</mat-option> }
            </mat-select>
          </mat-form-field>
          @for (p of parameters(); track p.key) {
            <mat-form-field appearance="outline" subscriptSizing="dynamic">
              <mat-label>{{ p.label }}</mat-label>
              <input matInput type="number" step="any" [value]="draft()[p.key] ?? ''" (input)="setNumber(p.key, $event)">
              <span matTextSuffix>{{ unitOf(p.unit) }}</span>
            </mat-form-field>
          }
          <mat-form-field appearance="outline" subscriptSizing="dynamic">
            <mat-label>Cut-off</mat-label>
            <input matInput type="number" step="any" [value]="draft().cutoff ?? ''" (input)="setNumber('cutoff', $event)">
            <span matTextSuffix>{{ suffixLabels[draft().length] }}</span>
          </mat-form-field>
          <mat-form-field appearance="outline" subscriptSizing="dynamic">
            <mat-label>At the cut-off</mat-label>
            <mat-select [value]="draft().truncation" (selectionChange)="set({ truncation: $event.value })">
              @for (t of truncations; track t) { <mat-option [value]="t">{{ truncationLabels[t] }}</mat-option> }
            </mat-select>
          </mat-form-field>
          @if (draft().form !== 'table') {
            <mat-checkbox [checked]="draft().tail" (change)="set({ tail: $event.checked })">Analytic tail correction (homogeneous fluid)</mat-checkbox>
          }
          @if (draft().form === 'table') {
            <mat-form-field appearance="outline" subscriptSizing="dynamic" class="wide">
              <mat-label>Table: one "r, U" per line, r in Å</mat-label>
              <textarea matInput rows="5" [value]="draft().csv" (input)="set({ csv: value($event) })"></textarea>
              <mat-hint>Paste a CSV or read a file; U(r) is interpolated by a natural cubic spline, forces from its derivative.</mat-hint>
            </mat-form-field>
            <label class="file">
              <input type="file" accept=".csv,.txt,text/csv,text/plain" (change)="readTable($event)">
            </label>
          }
        }
      </div>
      @if (issues().length) {
        <ul class="issues" role="alert">
          @for (i of issues(); track i) { <li>{{ i }}</li> }
        </ul>
      }
      @if (resolved(); as pair) {
        @if (pair.form !== 'none') { <erg-potential-plot [pair]="pair" /> }
      }
    </section>
  `,
  styles: `
    :host { display: block; min-width: 0; }
    .pair { min-width: 0; border: 1px solid var(--mat-sys-outline-variant); border-radius: 16px; padding: 8px 16px 12px; background: var(--mat-sys-surface-container-lowest); }
    header { display: flex; align-items: center; justify-content: space-between; }
    h3 { margin: 0; }
    .fields { display: flex; flex-wrap: wrap; gap: 12px; align-items: center; margin-top: 8px; }
    .fields mat-form-field { flex: 1 1 180px; min-width: 0; }
    .fields .short { flex: 1 1 120px; }
    .fields .wide, .fields mat-checkbox, .fields .file { flex: 1 1 100%; }
    .issues { margin: 4px 0; padding-left: 20px; color: var(--mat-sys-error); font: var(--mat-sys-body-small); }
    .file { font: var(--mat-sys-body-small); }
  `,
})
export class PairEditor {
  readonly draft = input.required<PairDraft>();
  readonly index = input.required<number>();
  readonly issues = input<string[]>([]);
  readonly changed = output<PairDraft>();
  readonly remove = output<void>();

  protected readonly forms = PAIR_FORMS;
  protected readonly formLabels = FORM_LABELS;
  protected readonly truncations = TRUNCATIONS;
  protected readonly truncationLabels = TRUNCATION_LABELS;
  protected readonly energySuffixes: EnergySuffix[] = ['EV', 'KJPerMol', 'KcalPerMol', 'K'];
  protected readonly lengthSuffixes: LengthSuffix[] = ['A', 'Nm'];
  protected readonly energyUnits = ENERGY_UNIT_LIST;
  protected readonly suffixLabels = SUFFIX_LABELS;
  protected readonly parameters = computed(() => PARAMETERS[this.draft().form]);
  protected readonly resolved = computed(() => resolvedDraftPair(this.draft()));

  protected value(event: Event): string {
    return (event.target as HTMLInputElement | HTMLTextAreaElement).value;
  }

  protected set(change: Partial<PairDraft> & { form?: PairForm }): void {
    this.changed.emit({ ...this.draft(), ...change });
  }

  protected setNumber(key: 'p1' | 'p2' | 'p3' | 'cutoff', event: Event): void {
    const text = this.value(event).trim();
    const n = Number(text);
    this.set({ [key]: text === '' || !Number.isFinite(n) ? null : n } as Partial<PairDraft>);
  }

  protected unitOf(kind: 'energy' | 'length' | 'inverse' | 'c6'): string {
    const d = this.draft();
    // Short forms beside a number; the unit list says "K (as E/k_B)" in full.
    const e = d.energy === 'K' ? 'K' : SUFFIX_LABELS[d.energy], l = SUFFIX_LABELS[d.length];
    return kind === 'energy' ? e : kind === 'length' ? l : kind === 'inverse' ? `${l}⁻¹` : `${e}·${l}⁶`;
  }

  protected readTable(event: Event): void {
    const file = (event.target as HTMLInputElement).files?.[0];
    if (!file) return;
    void file.text().then((csv) => this.set({ csv }));
  }
}
