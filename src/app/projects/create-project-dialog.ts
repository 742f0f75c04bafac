import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { firstValueFrom } from 'rxjs';
import { PROJECT_DESCRIPTION_MAX_LENGTH, PROJECT_NAME_MAX_LENGTH } from '../../../shared/account-rules';
import { apiErrorMessage } from '../core/api-error';
import type { ProjectSummary } from '../../../shared/projects';
import { ProjectsApi } from './projects-api';

/** Closes with the created project, or nothing when cancelled. */
@Component({
  selector: 'erg-create-project-dialog',
  imports: [ReactiveFormsModule, MatDialogModule, MatButtonModule, MatFormFieldModule, MatInputModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 mat-dialog-title>New project</h2>
    <form [formGroup]="form" (ngSubmit)="create()" novalidate>
      <mat-dialog-content class="form-stack">
        <mat-form-field subscriptSizing="dynamic">
          <mat-label>Project name</mat-label>
          <input matInput formControlName="name" required cdkFocusInitial>
          @if (form.controls.name.hasError('required')) { <mat-error>Give the project a name.</mat-error> }
          @if (form.controls.name.hasError('maxlength')) { <mat-error>At most {{ nameMax }} characters.</mat-error> }
        </mat-form-field>
        <mat-form-field subscriptSizing="dynamic">
          <mat-label>Description</mat-label>
          <textarea matInput formControlName="description" rows="3"></textarea>
          <mat-hint>Optional: the system, the question, the people.</mat-hint>
          @if (form.controls.description.hasError('maxlength')) { <mat-error>At most {{ descriptionMax }} characters.</mat-error> }
        </mat-form-field>
        @if (error()) { <p class="form-error" role="alert">{{ error() }}</p> }
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="busy()">Create project</button>
      </mat-dialog-actions>
    </form>
  `,
  // The dialog's own content style would lay the fields side by side; they stack at full width so the hint shows whole.
  styles: `
    .mat-mdc-dialog-content.form-stack { display: flex; flex-direction: column; gap: 8px; width: min(480px, 100%); box-sizing: border-box; }
    mat-form-field { width: 100%; }
  `,
})
export class CreateProjectDialog {
  private readonly api = inject(ProjectsApi);
  private readonly dialogRef = inject<MatDialogRef<CreateProjectDialog, ProjectSummary>>(MatDialogRef);

  protected readonly nameMax = PROJECT_NAME_MAX_LENGTH;
  protected readonly descriptionMax = PROJECT_DESCRIPTION_MAX_LENGTH;
  protected readonly busy = signal(false);
  protected readonly error = signal('');
  protected readonly form = inject(FormBuilder).nonNullable.group({
    name: ['', [Validators.required, Validators.maxLength(PROJECT_NAME_MAX_LENGTH)]],
    description: ['', Validators.maxLength(PROJECT_DESCRIPTION_MAX_LENGTH)],
  });

  protected async create(): Promise<void> {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.busy.set(true);
    this.error.set('');
    try {
      const { name, description } = this.form.getRawValue();
      this.dialogRef.close(await firstValueFrom(this.api.create(name.trim(), description.trim())));
    } catch (err) {
      this.error.set(apiErrorMessage(err));
    } finally {
      this.busy.set(false);
    }
  }
}
