import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { MissingPairError, resolvePairsFor, type ResolvedPair } from '../../../shared/interaction-model';
import type { InteractionPreset } from '../../../shared/interaction-presets';
import { apiErrorMessage } from '../core/api-error';
import { formatNumber } from '../reports/number-format';
import { InteractionModelApi, type ModelTarget } from './interaction-model-api';
import { draftIssues, draftModel, emptyPair, fromModel, type ModelDraft, type PairDraft } from './pair-drafts';
import { PairEditor } from './pair-editor';

export interface InteractionModelDialogData {
  target: ModelTarget;
  /** What the model belongs to, for the title: a trajectory's or a project's name. */
  name: string;
  /** Species of the trajectory, to check the model covers them (empty for a project). */
  species: string[];
  canEdit: boolean;
}

/** Edits the pair potentials of a trajectory or a project, with presets, validation that names the field, and U(r) per pair. */
@Component({
  selector: 'erg-interaction-model-dialog',
  imports: [MatDialogModule, MatButtonModule, MatFormFieldModule, MatInputModule, MatSelectModule, MatIconModule, PairEditor],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 mat-dialog-title>Interaction model · {{ data.name }}</h2>
    <mat-dialog-content>
      <p class="status" role="status">{{ status() }}</p>
      <div class="top">
        <mat-form-field appearance="outline" subscriptSizing="dynamic" class="grow">
          <mat-label>Start from a published set</mat-label>
          <mat-select (selectionChange)="applyPreset($event.value)" [disabled]="!data.canEdit">
            @for (p of presets(); track p.id) {
              <mat-option [value]="p">{{ p.name }} <span class="tag">{{ p.sourceStatus }}</span></mat-option>
            }
          </mat-select>
        </mat-form-field>
        <mat-form-field appearance="outline" subscriptSizing="dynamic" class="grow">
          <mat-label>Name</mat-label>
          <input matInput [value]="draft().name" (input)="patch({ name: value($event) })">
        </mat-form-field>
        <mat-form-field appearance="outline" subscriptSizing="dynamic" class="grow">
          <mat-label>Unlike LJ pairs not listed</mat-label>
          <mat-select [value]="draft().mixing" (selectionChange)="patch({ mixing: $event.value })">
            <mat-option value="lorentz-berthelot">Lorentz–Berthelot mixing</mat-option>
            <mat-option value="none">No mixing: list every pair</mat-option>
          </mat-select>
        </mat-form-field>
        <mat-form-field appearance="outline" subscriptSizing="dynamic" class="full">
          <mat-label>Source of the parameters</mat-label>
          <input matInput [value]="draft().source" (input)="patch({ source: value($event) })" placeholder="Citation, or how they were fitted">
        </mat-form-field>
      </div>
      @if (presetNote()) { <p class="note">{{ presetNote() }}</p> }
      <div class="pairs">
        @for (pair of draft().pairs; track $index) {
          <erg-pair-editor [draft]="pair" [index]="$index" [issues]="issuesOf($index)" (changed)="setPair($index, $event)" (remove)="removePair($index)" />
        }
      </div>
      <button mat-stroked-button type="button" (click)="addPair()" [disabled]="!data.canEdit"><mat-icon>add</mat-icon> Add a pair</button>
      @if (modelIssues().length) {
        <ul class="issues" role="alert">@for (i of modelIssues(); track i) { <li>{{ i }}</li> }</ul>
      }
      @if (coverage(); as c) {
        <p class="coverage" [class.bad]="c.problem">{{ c.text }}</p>
      }
      @if (error()) { <p class="issues" role="alert">{{ error() }}</p> }
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      @if (stored() && data.canEdit) {
        <button mat-button type="button" (click)="removeStored()" [disabled]="saving()">Remove this model</button>
      }
      <button mat-button type="button" mat-dialog-close>Cancel</button>
      @if (data.canEdit) {
        <button mat-flat-button type="button" (click)="save()" [disabled]="saving() || !valid()">Save</button>
      }
    </mat-dialog-actions>
  `,
  styles: `
    .status { margin-top: 0; color: var(--mat-sys-on-surface-variant); }
    .top { display: flex; flex-wrap: wrap; gap: 12px; margin-bottom: 12px; }
    .top .grow { flex: 1 1 220px; }
    .top .full { flex: 1 1 100%; }
    .tag { font-size: 11px; margin-left: 6px; padding: 0 6px; border-radius: 999px; background: var(--mat-sys-secondary-container); }
    .note { font: var(--mat-sys-body-small); color: var(--mat-sys-on-surface-variant); margin-top: -8px; }
    /* minmax(0, …): a pair (and its plot's canvas) shrinks with the dialog instead of holding it at its first width. */
    .pairs { display: grid; grid-template-columns: minmax(0, 1fr); gap: 12px; margin-bottom: 12px; }
    .issues { color: var(--mat-sys-error); font: var(--mat-sys-body-small); padding-left: 20px; }
    .coverage { font: var(--mat-sys-body-small); color: var(--mat-sys-on-surface-variant); }
    .coverage.bad { color: var(--mat-sys-error); }
  `,
})
export class InteractionModelDialog {
  protected readonly data = inject<InteractionModelDialogData>(MAT_DIALOG_DATA);
  private readonly api = inject(InteractionModelApi);
  private readonly ref = inject(MatDialogRef<InteractionModelDialog, boolean>);

  protected readonly draft = signal<ModelDraft>(fromModel(null));
  protected readonly presets = signal<InteractionPreset[]>([]);
  protected readonly presetNote = signal('');
  protected readonly status = signal('Loading…');
  protected readonly stored = signal(false);
  protected readonly saving = signal(false);
  protected readonly error = signal('');

  protected readonly issues = computed(() => draftIssues(this.draft()));
  protected readonly valid = computed(() => this.issues().length === 0);
  protected readonly modelIssues = computed(() => this.issues().filter((i) => !i.startsWith('pairs[')));
  protected readonly coverage = computed((): { text: string; problem: boolean } | null => {
    const model = draftModel(this.draft());
    if (!model || this.data.species.length === 0) return null;
    try {
      const pairs = resolvePairsFor(model, this.data.species);
      const mixed = pairs.filter((p) => p.origin === 'mixed');
      return { problem: false, text: `Covers every pair of ${this.data.species.join(', ')}.${mixed.length ? ` Mixed by Lorentz–Berthelot: ${mixed.map(describeMixed).join('; ')}.` : ''}` };
    } catch (err) {
      return err instanceof MissingPairError ? { problem: true, text: `This model ${err.message}.` } : null;
    }
  });

  constructor() {
    this.api.presets().subscribe({ next: (p) => this.presets.set(p), error: () => this.presets.set([]) });
    const t = this.data.target;
    if (t.kind === 'trajectory') {
      this.api.trajectoryView(t.id).subscribe({
        next: (view) => {
          this.stored.set(view.source === 'trajectory');
          this.status.set(view.source === 'trajectory' ? 'This trajectory has its own model; it wins over the project’s.'
            : view.source === 'project' ? 'This trajectory uses its project’s model. Saving here gives it a model of its own.'
              : 'No model yet: the energy analysis can only use energies stored in the file.');
          if (view.model) this.draft.set(fromModel(view.model));
          else this.draft.set({ ...fromModel(null), pairs: [emptyPair(this.data.species[0] ?? '', this.data.species[0] ?? '')] });
        },
        error: (err: unknown) => this.status.set(apiErrorMessage(err, 'The model could not be loaded.')),
      });
    } else {
      this.api.projectModel(t.id).subscribe({
        next: (model) => {
          this.stored.set(model !== null);
          this.status.set(model ? 'Shared by every trajectory of the project that has no model of its own.' : 'No shared model yet.');
          if (model) this.draft.set(fromModel(model));
        },
        error: (err: unknown) => this.status.set(apiErrorMessage(err, 'The model could not be loaded.')),
      });
    }
  }

  protected value(event: Event): string {
    return (event.target as HTMLInputElement).value;
  }

  protected patch(change: Partial<ModelDraft>): void {
    this.draft.update((d) => ({ ...d, ...change }));
  }

  protected setPair(index: number, pair: PairDraft): void {
    this.draft.update((d) => ({ ...d, pairs: d.pairs.map((p, i) => (i === index ? pair : p)) }));
  }

  protected addPair(): void {
    this.draft.update((d) => ({ ...d, pairs: [...d.pairs, emptyPair()] }));
  }

  protected removePair(index: number): void {
    this.draft.update((d) => ({ ...d, pairs: d.pairs.filter((_, i) => i !== index) }));
  }

  protected issuesOf(index: number): string[] {
    const prefix = `pairs[${index}]`;
    return this.issues().filter((i) => i.startsWith(prefix)).map((i) => i.slice(prefix.length).replace(/^ \([^)]*\)/, '').replace(/^\./, '') || i);
  }

  protected applyPreset(preset: InteractionPreset): void {
    this.draft.set(fromModel(preset.model));
    this.presetNote.set(`${preset.description} Source: ${preset.source}${preset.sourceStatus === 'from memory' ? ' (from memory: check before relying on it)' : ''}.`);
  }

  protected save(): void {
    const model = draftModel(this.draft());
    if (!model) return;
    this.saving.set(true);
    this.error.set('');
    this.api.save(this.data.target, model).subscribe({
      next: () => this.ref.close(true),
      error: (err: unknown) => {
        this.saving.set(false);
        this.error.set(apiErrorMessage(err, 'The model could not be saved.'));
      },
    });
  }

  protected removeStored(): void {
    this.saving.set(true);
    this.api.remove(this.data.target).subscribe({
      next: () => this.ref.close(true),
      error: (err: unknown) => {
        this.saving.set(false);
        this.error.set(apiErrorMessage(err, 'The model could not be removed.'));
      },
    });
  }
}

function describeMixed(p: ResolvedPair): string {
  return p.form === 'lj' ? `${p.species.join('–')} σ = ${formatNumber(p.sigmaA, 4)} Å, ε = ${formatNumber(p.epsilonEV, 4)} eV` : p.species.join('–');
}
