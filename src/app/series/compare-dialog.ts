import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormControl, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { firstValueFrom } from 'rxjs';
import { SERIES_MAX_MEMBERS, SERIES_MIN_MEMBERS, SERIES_NAME_MAX_LENGTH, type SeriesDto } from '../../../shared/series-api';
import type { TrajectoryDto } from '../../../shared/trajectory';
import { apiErrorMessage } from '../core/api-error';
import { SeriesApi } from './series-api';
import { suggestedSeriesName, temperatureOrder } from './series-naming';

export interface CompareDialogData {
  projectId: number;
  trajectories: TrajectoryDto[];
}

/** Names a new series of the ticked trajectories (coldest first) and creates it; closes with the series. */
@Component({
  selector: 'erg-compare-dialog',
  imports: [ReactiveFormsModule, MatDialogModule, MatButtonModule, MatFormFieldModule, MatInputModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 mat-dialog-title>Compare {{ ordered.length }} trajectories as a series</h2>
    <form (submit)="$event.preventDefault(); create()" novalidate>
      <mat-dialog-content class="form-stack">
        <p class="muted">A series compares runs of one system across temperature: D(T) and its Arrhenius fit, the phase of each run, melting and vaporization brackets, the caloric curve and Cv(T). Each run's missing analyses start now; finished reports are reused.</p>
        <mat-form-field>
          <mat-label>Series name</mat-label>
          <input matInput [formControl]="name" required cdkFocusInitial [maxlength]="nameMax">
          @if (name.hasError('required') || name.hasError('pattern')) { <mat-error>Give the series a name.</mat-error> }
        </mat-form-field>
        <ol class="members" aria-label="Members, in the order of the series">
          @for (t of ordered; track t.id) {
            <li>{{ t.name }} <span class="muted">{{ t.temperatureK !== null ? t.temperatureK + ' K stated' : 'no stated temperature' }}</span></li>
          }
        </ol>
        @if (countProblem) { <p class="form-error" role="alert">{{ countProblem }}</p> }
        @if (error()) { <p class="form-error" role="alert">{{ error() }}</p> }
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="busy() || !!countProblem">Create series</button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    .members { margin: 0; padding-left: 20px; display: flex; flex-direction: column; gap: 2px; max-height: 220px; overflow: auto; }
    .members .muted { font: var(--mat-sys-body-small); color: var(--mat-sys-on-surface-variant); margin-left: 6px; }
    p.muted { margin: 0 0 12px; max-width: 60ch; }
  `,
})
export class CompareDialog {
  private readonly data = inject<CompareDialogData>(MAT_DIALOG_DATA);
  private readonly api = inject(SeriesApi);
  private readonly dialogRef = inject<MatDialogRef<CompareDialog, SeriesDto>>(MatDialogRef);

  protected readonly nameMax = SERIES_NAME_MAX_LENGTH;
  protected readonly ordered = temperatureOrder(this.data.trajectories);
  protected readonly countProblem = this.ordered.length < SERIES_MIN_MEMBERS
    ? `Tick at least ${SERIES_MIN_MEMBERS} trajectories to compare.`
    : this.ordered.length > SERIES_MAX_MEMBERS ? `A series holds at most ${SERIES_MAX_MEMBERS} trajectories; ${this.ordered.length} are ticked.` : '';
  protected readonly name = new FormControl(suggestedSeriesName(this.ordered), { nonNullable: true, validators: [Validators.required, Validators.pattern(/\S/)] });
  protected readonly busy = signal(false);
  protected readonly error = signal('');

  protected async create(): Promise<void> {
    if (this.name.invalid || this.countProblem) {
      this.name.markAsTouched();
      return;
    }
    this.busy.set(true);
    this.error.set('');
    try {
      const series = await firstValueFrom(this.api.create(this.data.projectId, { name: this.name.value.trim(), trajectoryIds: this.ordered.map((t) => t.id) }));
      this.dialogRef.close(series);
    } catch (err) {
      this.error.set(apiErrorMessage(err, 'The series could not be created.'));
    } finally {
      this.busy.set(false);
    }
  }
}
