import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { map } from 'rxjs';
import { formatBytes } from '../../../shared/byte-size';
import {
  ENSEMBLES, LENGTH_UNITS, TIME_UNITS, UNIT_LABELS, VELOCITY_UNITS, trajectoryMetadataSchema,
  type TrajectoryDto, type TrajectoryMetadata,
} from '../../../shared/trajectory';
import { apiErrorMessage } from '../core/api-error';
import { fieldProblems, initialValues, type MetadataFormValues } from './metadata-form';
import type { FileQuantities } from '../../../shared/file-quantities';
import { FileQuantitiesFields } from './file-quantities-fields';
import { SpeciesElementsFields } from './species-elements-fields';
import type { SpeciesElementChoice } from '../../../shared/trajectory';
import { TrajectoriesApi } from './trajectories-api';

/**
 * The metadata form in three uses: correcting one trajectory, one change for
 * several selected ones, and describing files before they are uploaded (so the
 * first inspection already knows their units and time step).
 */
export type MetadataDialogData =
  | { kind: 'one'; trajectory: TrajectoryDto }
  | { kind: 'many'; trajectories: readonly TrajectoryDto[] }
  | { kind: 'upload'; files: readonly File[] };

export type MetadataDialogResult =
  | { kind: 'saved'; trajectories: TrajectoryDto[] }
  | { kind: 'upload'; metadata: TrajectoryMetadata };

@Component({
  selector: 'erg-metadata-dialog',
  imports: [ReactiveFormsModule, MatDialogModule, MatFormFieldModule, MatInputModule, MatSelectModule, MatButtonModule, MatIconModule, FileQuantitiesFields, SpeciesElementsFields],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 mat-dialog-title>{{ title }}</h2>
    <form [formGroup]="form" (ngSubmit)="save()" id="metadata-form">
      <mat-dialog-content class="grid">
        @switch (data.kind) {
          @case ('one') { <p class="hint">Values read from the file are marked <span class="from-file">from file</span>; correct them if the file is wrong.</p> }
          @case ('many') { <p class="hint">Only the fields you change are applied to all {{ count }}; the others keep each trajectory's own value.</p> }
          @case ('upload') {
            <ul class="files" aria-label="Files to upload">
              @for (f of files; track f.name) { <li><span class="file-name">{{ f.name }}</span><span class="muted"> · {{ size(f.size) }}</span></li> }
            </ul>
            <p class="hint">Everything here is optional: fill in what the files do not say. What a file states itself is read from it.</p>
          }
        }
        @if (data.kind === 'one') {
          <mat-form-field appearance="outline" class="wide">
            <mat-label>Name</mat-label>
            <input matInput formControlName="name" required>
            @if (form.controls.name.hasError('required')) { <mat-error>Give the trajectory a name.</mat-error> }
          </mat-form-field>
        }
        <mat-form-field appearance="outline">
          <mat-label>Temperature (K)</mat-label>
          <input matInput type="number" formControlName="temperatureK" min="0" step="any" [placeholder]="placeholder('temperatureK')">
          @if (form.controls.temperatureK.invalid) { <mat-error>{{ problem('temperatureK') }}</mat-error> }
        </mat-form-field>
        <mat-form-field appearance="outline">
          <mat-label>Ensemble</mat-label>
          <mat-select formControlName="ensemble">
            <mat-option [value]="null">{{ data.kind === 'many' ? 'Leave as it is' : 'Not stated' }}</mat-option>
            @for (e of ensembles; track e) { <mat-option [value]="e">{{ e }}</mat-option> }
          </mat-select>
        </mat-form-field>
        <mat-form-field appearance="outline">
          <mat-label>Time between frames</mat-label>
          <input matInput type="number" formControlName="timeStep" min="0" step="any" [placeholder]="placeholder('timeStep')">
          @if (fromFile('timeStep')) { <span matTextSuffix class="from-file">from file</span> }
          @if (form.controls.timeStep.invalid) { <mat-error>{{ problem('timeStep') }}</mat-error> }
        </mat-form-field>
        <mat-form-field appearance="outline">
          <mat-label>Time unit</mat-label>
          <mat-select formControlName="timeUnit">
            @if (data.kind === 'many') { <mat-option [value]="null">Leave as it is</mat-option> }
            @for (u of timeUnits; track u) { <mat-option [value]="u">{{ label(u) }}</mat-option> }
          </mat-select>
        </mat-form-field>
        <mat-form-field appearance="outline">
          <mat-label>Length unit</mat-label>
          <mat-select formControlName="lengthUnit">
            @if (data.kind === 'many') { <mat-option [value]="null">Leave as it is</mat-option> }
            @for (u of lengthUnits; track u) { <mat-option [value]="u">{{ label(u) }}</mat-option> }
          </mat-select>
        </mat-form-field>
        <mat-form-field appearance="outline">
          <mat-label>Velocity unit</mat-label>
          <mat-select formControlName="velocityUnit">
            @if (data.kind === 'many') { <mat-option [value]="null">Leave as it is</mat-option> }
            @for (u of velocityUnits; track u) { <mat-option [value]="u">{{ label(u) }}</mat-option> }
          </mat-select>
        </mat-form-field>
        <mat-form-field appearance="outline">
          <mat-label>Boundary</mat-label>
          <mat-select formControlName="boundary">
            @if (data.kind === 'many') { <mat-option [value]="null">Leave as it is</mat-option> }
            <mat-option value="periodic">Periodic</mat-option>
            <mat-option value="walls">Reflecting walls</mat-option>
            <mat-option value="none">None</mat-option>
          </mat-select>
          @if (fromFile('boundary')) { <span matTextSuffix class="from-file">from file</span> }
        </mat-form-field>
        <mat-form-field appearance="outline">
          <mat-label>Constraints</mat-label>
          <input matInput type="number" formControlName="constraints" min="0" step="1" [placeholder]="placeholder('constraints')">
          <mat-hint>Rigid bonds and frozen rotations: 3 per rigid water, 2 per non-rotating diatomic</mat-hint>
          @if (form.controls.constraints.invalid) { <mat-error>{{ problem('constraints') }}</mat-error> }
        </mat-form-field>
        <mat-form-field appearance="outline" class="wide">
          <mat-label>Potential or force field</mat-label>
          <input matInput formControlName="potential" [placeholder]="placeholder('potential')">
        </mat-form-field>
        <mat-form-field appearance="outline" class="wide">
          <mat-label>Simulation engine</mat-label>
          <input matInput formControlName="engine" [placeholder]="placeholder('engine')">
        </mat-form-field>
        <mat-form-field appearance="outline" class="wide">
          <mat-label>Notes</mat-label>
          <textarea matInput formControlName="notes" rows="3" [placeholder]="placeholder('notes')"></textarea>
        </mat-form-field>
        @if (data.kind === 'one' && data.trajectory.speciesCounts) {
          <erg-species-elements-fields class="wide" [speciesCounts]="data.trajectory.speciesCounts" [elements]="data.trajectory.speciesElements"
            (choicesChange)="speciesChoices.set($event)" (validChange)="speciesValid.set($event)" />
        }
        @if (data.kind === 'one' && data.trajectory.fileValues.length) {
          <erg-file-quantities-fields class="wide" [keys]="data.trajectory.fileValues" [value]="quantities()" (valueChange)="quantities.set($event); quantitiesChanged.set(true)" />
        }
        @if (error()) { <p class="error wide" role="alert">{{ error() }}</p> }
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="saving()">{{ submitLabel }}</button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    .grid { display: grid; grid-template-columns: repeat(2, minmax(0, 1fr)); gap: 4px 16px; }
    .wide, .hint, .files { grid-column: 1 / -1; }
    .hint { color: var(--mat-sys-on-surface-variant); margin-top: 0; }
    .files { list-style: none; padding: 0; margin: 0 0 8px; display: grid; gap: 2px; }
    .file-name { font-weight: 500; overflow-wrap: anywhere; }
    .muted { color: var(--mat-sys-on-surface-variant); }
    .from-file { display: inline-block; font-size: 11px; line-height: 18px; padding: 0 8px; border-radius: 999px; white-space: nowrap;
                 background: var(--mat-sys-tertiary-container); color: var(--mat-sys-on-tertiary-container); margin-right: 8px; }
    .error { color: var(--mat-sys-error); }
    @media (max-width: 600px) { .grid { grid-template-columns: minmax(0, 1fr); } }
  `,
})
export class MetadataDialog {
  protected readonly data = inject<MetadataDialogData>(MAT_DIALOG_DATA);
  private readonly api = inject(TrajectoriesApi);
  private readonly ref = inject(MatDialogRef<MetadataDialog, MetadataDialogResult>);
  protected readonly ensembles = ENSEMBLES;
  protected readonly timeUnits = TIME_UNITS;
  protected readonly lengthUnits = LENGTH_UNITS;
  protected readonly velocityUnits = VELOCITY_UNITS;
  protected readonly size = formatBytes;
  protected readonly saving = signal(false);
  protected readonly error = signal('');
  protected readonly files = this.data.kind === 'upload' ? this.data.files : [];
  protected readonly count = this.data.kind === 'many' ? this.data.trajectories.length : 1;
  protected readonly title = this.data.kind === 'one' ? `Metadata of ${this.data.trajectory.name}`
    : this.data.kind === 'many' ? `Metadata of ${this.count} trajectories` : `Upload ${this.files.length === 1 ? this.files[0]!.name : `${this.files.length} files`}`;
  protected readonly submitLabel = this.data.kind === 'upload' ? 'Upload' : this.data.kind === 'many' ? `Apply to ${this.count}` : 'Save';
  private readonly initial = initialValues(this.data);
  protected readonly quantities = signal<FileQuantities | null>(this.data.kind === 'one' ? this.data.trajectory.fileQuantities : null);
  protected readonly quantitiesChanged = signal(false);
  protected readonly speciesChoices = signal<Record<string, SpeciesElementChoice> | null>(null);
  protected readonly speciesValid = signal(true);

  protected readonly form = inject(FormBuilder).group({
    name: [this.initial.values.name, this.data.kind === 'one' ? Validators.required : []],
    temperatureK: [this.initial.values.temperatureK, Validators.min(Number.MIN_VALUE)],
    ensemble: [this.initial.values.ensemble],
    timeStep: [this.initial.values.timeStep, Validators.min(Number.MIN_VALUE)],
    timeUnit: [this.initial.values.timeUnit],
    lengthUnit: [this.initial.values.lengthUnit],
    velocityUnit: [this.initial.values.velocityUnit],
    boundary: [this.initial.values.boundary],
    constraints: [this.initial.values.constraints, [Validators.min(0), Validators.pattern(/^\d+$/)]],
    potential: [this.initial.values.potential],
    engine: [this.initial.values.engine],
    notes: [this.initial.values.notes],
  });

  protected label(unit: string): string {
    return UNIT_LABELS[unit] ?? unit;
  }

  /** "various" where the selected trajectories differ and the field is left as it is. */
  protected placeholder(field: keyof MetadataFormValues): string {
    return this.initial.mixed.has(field) ? 'various: left as they are' : '';
  }

  protected problem(field: keyof MetadataFormValues): string {
    const control = this.form.get(field);
    return fieldProblems(field, control?.errors ?? null);
  }

  protected fromFile(field: string): boolean {
    return this.data.kind === 'one' && this.data.trajectory.fromFile.includes(field) && !this.form.get(field)?.dirty;
  }

  protected save(): void {
    this.form.markAllAsTouched();
    if (this.form.invalid) return;
    if (!this.speciesValid()) {
      this.error.set('Some species need a valid element symbol or a mass (see the species above).');
      return;
    }
    // Only what the user changed is sent, so untouched values stay as they are (and stay marked as read from the file).
    const raw = this.form.getRawValue();
    const changed: Record<string, unknown> = Object.fromEntries(Object.entries(raw).filter(([key, value]) => this.form.get(key)?.dirty && !(this.data.kind !== 'one' && value === null)));
    if (this.quantitiesChanged()) changed['fileQuantities'] = this.quantities();
    const species = this.speciesChoices();
    if (species) changed['speciesElements'] = species;
    const parsed = trajectoryMetadataSchema.safeParse(changed);
    if (!parsed.success) {
      this.error.set(parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; '));
      return;
    }
    if (this.data.kind === 'upload') {
      this.ref.close({ kind: 'upload', metadata: parsed.data });
      return;
    }
    if (Object.keys(parsed.data).length === 0) {
      this.ref.close();
      return;
    }
    this.saving.set(true);
    const request = this.data.kind === 'one'
      ? this.api.update(this.data.trajectory.id, parsed.data).pipe(map((t) => [t]))
      : this.api.updateMany(this.data.trajectories[0]!.projectId, this.data.trajectories.map((t) => t.id), parsed.data);
    request.subscribe({
      next: (trajectories) => this.ref.close({ kind: 'saved', trajectories }),
      error: (err: unknown) => {
        this.saving.set(false);
        this.error.set(apiErrorMessage(err, 'The metadata could not be saved.'));
      },
    });
  }
}
