import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import type { TrajectoryDto } from '../../../shared/trajectory';
import { TrajectoriesApi } from './trajectories-api';

/** A frame range of a trajectory, downloaded as extended XYZ. */
@Component({
  selector: 'erg-cut-dialog',
  imports: [FormsModule, MatDialogModule, MatFormFieldModule, MatInputModule, MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 mat-dialog-title>Download a cut of {{ t.name }}</h2>
    <mat-dialog-content class="grid">
      <p class="hint">Frames are numbered from 1 to {{ t.frames }}. The cut is written as extended XYZ, with velocities when the file has them.</p>
      <mat-form-field appearance="outline"><mat-label>First frame</mat-label>
        <input matInput type="number" [ngModel]="first()" (ngModelChange)="first.set($event)" min="1" [max]="t.frames"></mat-form-field>
      <mat-form-field appearance="outline"><mat-label>Last frame</mat-label>
        <input matInput type="number" [ngModel]="last()" (ngModelChange)="last.set($event)" min="1" [max]="t.frames"></mat-form-field>
      <mat-form-field appearance="outline"><mat-label>Every n-th frame</mat-label>
        <input matInput type="number" [ngModel]="stride()" (ngModelChange)="stride.set($event)" min="1"></mat-form-field>
      @if (problem()) { <p class="error" role="alert">{{ problem() }}</p> }
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button type="button" mat-dialog-close>Close</button>
      @if (!problem()) { <a mat-flat-button [href]="url()" download>Download</a> }
    </mat-dialog-actions>
  `,
  styles: `.grid { display: grid; grid-template-columns: repeat(3, 1fr); gap: 0 12px; } .hint, .error { grid-column: 1 / -1; } .error { color: var(--mat-sys-error); } .hint { margin-top: 0; color: var(--mat-sys-on-surface-variant); }`,
})
export class CutDialog {
  protected readonly t = inject<TrajectoryDto>(MAT_DIALOG_DATA);
  private readonly api = inject(TrajectoriesApi);
  protected readonly first = signal(1);
  protected readonly last = signal(this.t.frames ?? 1);
  protected readonly stride = signal(1);
  protected readonly problem = computed(() => {
    const frames = this.t.frames ?? 0;
    const [a, b, s] = [this.first(), this.last(), this.stride()];
    if (![a, b, s].every(Number.isInteger)) return 'Frame numbers and the step must be whole numbers.';
    if (a < 1 || b > frames) return `Frames run from 1 to ${frames}.`;
    if (b < a) return 'The last frame must not come before the first.';
    if (s < 1) return 'The step must be at least 1.';
    return '';
  });
  protected readonly url = computed(() => this.api.cutUrl(this.t.id, this.first() - 1, this.last(), this.stride()));
}
