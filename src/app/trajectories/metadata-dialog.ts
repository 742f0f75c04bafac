import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import {
  BOUNDARIES, ENSEMBLES, LENGTH_UNITS, TIME_UNITS, UNIT_LABELS, VELOCITY_UNITS, trajectoryMetadataSchema,
  type TrajectoryDto, type TrajectoryMetadata,
} from '../../../shared/trajectory';
import { apiErrorMessage } from '../core/api-error';
import { TrajectoriesApi } from './trajectories-api';
import { FileQuantitiesFields } from './file-quantities-fields';
import type { FileQuantities } from '../../../shared/file-quantities';

/** What the uploader knows that the file may not say: temperature, ensemble, units, potential… */
@Component({
  selector: 'erg-metadata-dialog',
  imports: [ReactiveFormsModule, MatDialogModule, MatFormFieldModule, MatInputModule, MatSelectModule, MatButtonModule, MatIconModule, FileQuantitiesFields],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 mat-dialog-title>Metadata of {{ t.name }}</h2>
    <form [formGroup]="form" (ngSubmit)="save()" id="metadata-form">
      <mat-dialog-content class="grid">
        <p class="hint">Values read from the file are marked <span class="from-file">from file</span>; correct them if the file is wrong.</p>
        <mat-form-field appearance="outline" class="wide">
          <mat-label>Name</mat-label>
          <input matInput formControlName="name" required>
          @if (form.controls.name.hasError('required')) { <mat-error>Give the trajectory a name.</mat-error> }
        </mat-form-field>
        <mat-form-field appearance="outline">
          <mat-label>Temperature (K)</mat-label>
          <input matInput type="number" formControlName="temperatureK" min="0" step="any">
          @if (form.controls.temperatureK.hasError('min')) { <mat-error>A temperature must be above 0 K.</mat-error> }
        </mat-form-field>
        <mat-form-field appearance="outline">
          <mat-label>Ensemble</mat-label>
          <mat-select formControlName="ensemble">
            <mat-option [value]="null">Not stated</mat-option>
            @for (e of ensembles; track e) { <mat-option [value]="e">{{ e }}</mat-option> }
          </mat-select>
        </mat-form-field>
        <mat-form-field appearance="outline">
          <mat-label>Time between frames</mat-label>
          <input matInput type="number" formControlName="timeStep" min="0" step="any">
          @if (fromFile('timeStep')) { <span matSuffix class="from-file">from file</span> }
          @if (form.controls.timeStep.hasError('min')) { <mat-error>The time between frames must be above 0.</mat-error> }
        </mat-form-field>
        <mat-form-field appearance="outline">
          <mat-label>Time unit</mat-label>
          <mat-select formControlName="timeUnit">
            @for (u of timeUnits; track u) { <mat-option [value]="u">{{ label(u) }}</mat-option> }
          </mat-select>
        </mat-form-field>
        <mat-form-field appearance="outline">
          <mat-label>Length unit</mat-label>
          <mat-select formControlName="lengthUnit">
            @for (u of lengthUnits; track u) { <mat-option [value]="u">{{ label(u) }}</mat-option> }
          </mat-select>
        </mat-form-field>
        <mat-form-field appearance="outline">
          <mat-label>Velocity unit</mat-label>
          <mat-select formControlName="velocityUnit">
            @for (u of velocityUnits; track u) { <mat-option [value]="u">{{ label(u) }}</mat-option> }
          </mat-select>
        </mat-form-field>
        <mat-form-field appearance="outline">
          <mat-label>Boundary</mat-label>
          <mat-select formControlName="boundary">
            <mat-option value="periodic">Periodic</mat-option>
            <mat-option value="walls">Reflecting walls</mat-option>
            <mat-option value="none">None</mat-option>
          </mat-select>
          @if (fromFile('boundary')) { <span matSuffix class="from-file">from file</span> }
        </mat-form-field>
        <mat-form-field appearance="outline">
          <mat-label>Constraints</mat-label>
          <input matInput type="number" formControlName="constraints" min="0" step="1">
          <mat-hint>Rigid bonds and frozen rotations: 3 per rigid water, 2 per non-rotating diatomic</mat-hint>
          @if (form.controls.constraints.hasError('min') || form.controls.constraints.hasError('pattern')) { <mat-error>Constraints are a whole number, 0 or more.</mat-error> }
        </mat-form-field>
        <mat-form-field appearance="outline" class="wide">
          <mat-label>Potential or force field</mat-label>
          <input matInput formControlName="potential">
        </mat-form-field>
        <mat-form-field appearance="outline" class="wide">
          <mat-label>Simulation engine</mat-label>
          <input matInput formControlName="engine">
        </mat-form-field>
        <mat-form-field appearance="outline" class="wide">
          <mat-label>Notes</mat-label>
          <textarea matInput formControlName="notes" rows="3"></textarea>
        </mat-form-field>
        @if (t.fileValues.length) {
          <erg-file-quantities-fields class="wide" [keys]="t.fileValues" [value]="quantities()" (valueChange)="quantities.set($event); quantitiesChanged.set(true)" />
        }
        @if (error()) { <p class="error wide" role="alert">{{ error() }}</p> }
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="saving()">Save</button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    .grid { display: grid; grid-template-columns: 1fr 1fr; gap: 0 16px; }
    .wide, .hint { grid-column: 1 / -1; }
    .hint { color: var(--mat-sys-on-surface-variant); margin-top: 0; }
    .from-file { font-size: 11px; padding: 1px 8px; border-radius: 999px; background: var(--mat-sys-tertiary-container); color: var(--mat-sys-on-tertiary-container); margin-right: 8px; }
    .error { color: var(--mat-sys-error); }
  `,
})
export class MetadataDialog {
  protected readonly t = inject<TrajectoryDto>(MAT_DIALOG_DATA);
  private readonly api = inject(TrajectoriesApi);
  private readonly ref = inject(MatDialogRef<MetadataDialog, TrajectoryDto>);
  protected readonly ensembles = ENSEMBLES;
  protected readonly timeUnits = TIME_UNITS;
  protected readonly lengthUnits = LENGTH_UNITS;
  protected readonly velocityUnits = VELOCITY_UNITS;
  protected readonly boundaries = BOUNDARIES;
  protected readonly saving = signal(false);
  protected readonly error = signal('');
  protected readonly quantities = signal<FileQuantities | null>(this.t.fileQuantities);
  protected readonly quantitiesChanged = signal(false);

  protected readonly form = inject(FormBuilder).group({
    name: [this.t.name, Validators.required],
    temperatureK: [this.t.temperatureK, Validators.min(Number.MIN_VALUE)],
    ensemble: [this.t.ensemble as TrajectoryMetadata['ensemble']],
    timeStep: [this.t.timeStep, Validators.min(Number.MIN_VALUE)],
    timeUnit: [this.t.timeUnit as NonNullable<TrajectoryMetadata['timeUnit']>],
    lengthUnit: [this.t.lengthUnit as NonNullable<TrajectoryMetadata['lengthUnit']>],
    velocityUnit: [this.t.velocityUnit as NonNullable<TrajectoryMetadata['velocityUnit']>],
    boundary: [this.t.boundary as NonNullable<TrajectoryMetadata['boundary']>],
    constraints: [this.t.constraints, [Validators.min(0), Validators.pattern(/^\d+$/)]],
    potential: [this.t.potential],
    engine: [this.t.engine],
    notes: [this.t.notes],
  });

  protected label(unit: string): string {
    return UNIT_LABELS[unit] ?? unit;
  }

  protected fromFile(field: string): boolean {
    return this.t.fromFile.includes(field) && !this.form.get(field)?.dirty;
  }

  protected save(): void {
    if (this.form.invalid) return;
    const raw = this.form.getRawValue();
    // Only what the user changed is sent, so untouched values stay marked as read from the file.
    const changed: Record<string, unknown> = Object.fromEntries(Object.entries(raw).filter(([key]) => this.form.get(key)?.dirty));
    if (this.quantitiesChanged()) changed['fileQuantities'] = this.quantities();
    const parsed = trajectoryMetadataSchema.safeParse(changed);
    if (!parsed.success) {
      this.error.set(parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; '));
      return;
    }
    this.saving.set(true);
    this.api.update(this.t.id, parsed.data).subscribe({
      next: (t) => this.ref.close(t),
      error: (err: unknown) => {
        this.saving.set(false);
        this.error.set(apiErrorMessage(err, 'The metadata could not be saved.'));
      },
    });
  }
}
