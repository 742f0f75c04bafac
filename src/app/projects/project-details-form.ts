import { ChangeDetectionStrategy, Component, effect, inject, input, output, signal } from '@angular/core';
import { FormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { firstValueFrom } from 'rxjs';
import { PROJECT_DESCRIPTION_MAX_LENGTH, PROJECT_NAME_MAX_LENGTH } from '../../../shared/account-rules';
import { apiErrorMessage } from '../core/api-error';
import type { ProjectSummary } from '../../../shared/projects';
import { ProjectsApi } from './projects-api';

/** Rename and describe a project (editors and owners). */
@Component({
  selector: 'erg-project-details-form',
  imports: [ReactiveFormsModule, MatButtonModule, MatFormFieldModule, MatInputModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <form class="form-stack" [formGroup]="form" (ngSubmit)="save()" novalidate aria-label="Project name and description">
      <mat-form-field>
        <mat-label>Project name</mat-label>
        <input matInput formControlName="name" required>
        @if (form.controls.name.hasError('required')) { <mat-error>A project needs a name.</mat-error> }
        @if (form.controls.name.hasError('maxlength')) { <mat-error>At most {{ nameMax }} characters.</mat-error> }
      </mat-form-field>
      <mat-form-field>
        <mat-label>Description</mat-label>
        <textarea matInput formControlName="description" rows="3"></textarea>
        @if (form.controls.description.hasError('maxlength')) { <mat-error>At most {{ descriptionMax }} characters.</mat-error> }
      </mat-form-field>
      @if (error()) { <p class="form-error" role="alert">{{ error() }}</p> }
      @if (saved()) { <p role="status" class="muted">Saved.</p> }
      <div class="form-actions"><button mat-flat-button type="submit" [disabled]="busy() || form.pristine">Save changes</button></div>
    </form>
  `,
})
export class ProjectDetailsForm {
  private readonly api = inject(ProjectsApi);

  readonly project = input.required<ProjectSummary>();
  readonly changed = output<ProjectSummary>();
  protected readonly nameMax = PROJECT_NAME_MAX_LENGTH;
  protected readonly descriptionMax = PROJECT_DESCRIPTION_MAX_LENGTH;
  protected readonly busy = signal(false);
  protected readonly saved = signal(false);
  protected readonly error = signal('');
  protected readonly form = inject(FormBuilder).nonNullable.group({
    name: ['', [Validators.required, Validators.maxLength(PROJECT_NAME_MAX_LENGTH)]],
    description: ['', Validators.maxLength(PROJECT_DESCRIPTION_MAX_LENGTH)],
  });

  constructor() {
    // Follows the project the page loaded, without clobbering edits the user is making.
    effect(() => {
      const { name, description } = this.project();
      if (this.form.pristine) this.form.reset({ name, description });
    });
  }

  protected async save(): Promise<void> {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.busy.set(true);
    this.error.set('');
    this.saved.set(false);
    try {
      const { name, description } = this.form.getRawValue();
      const updated = await firstValueFrom(this.api.update(this.project().id, { name: name.trim(), description: description.trim() }));
      this.form.reset({ name: updated.name, description: updated.description });
      this.saved.set(true);
      this.changed.emit(updated);
    } catch (err) {
      this.error.set(apiErrorMessage(err));
    } finally {
      this.busy.set(false);
    }
  }
}
