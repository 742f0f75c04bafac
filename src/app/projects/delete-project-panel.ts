import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { Router } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { apiErrorMessage } from '../core/api-error';
import type { ProjectSummary } from '../../../shared/projects';
import { ProjectsApi } from './projects-api';

/** Deleting takes the project's exact name typed in, because nothing can bring it back. */
@Component({
  selector: 'erg-delete-project-panel',
  imports: [ReactiveFormsModule, MatButtonModule, MatFormFieldModule, MatInputModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <p>Deleting removes the project with all its trajectories, analyses, reports, comments and access links. This cannot be undone.</p>
    <form class="form-stack" (ngSubmit)="delete()" novalidate aria-label="Delete project">
      <mat-form-field>
        <mat-label>Type "{{ project().name }}" to confirm</mat-label>
        <input matInput [formControl]="confirmation" autocomplete="off">
      </mat-form-field>
      @if (error()) { <p class="form-error" role="alert">{{ error() }}</p> }
      <div class="form-actions">
        <button mat-flat-button class="danger" type="submit" [disabled]="!matches() || busy()">Delete this project</button>
      </div>
    </form>
  `,
  styles: `.danger { --mat-button-filled-container-color: var(--mat-sys-error); --mat-button-filled-label-text-color: var(--mat-sys-on-error); }`,
})
export class DeleteProjectPanel {
  private readonly api = inject(ProjectsApi);
  private readonly router = inject(Router);

  readonly project = input.required<ProjectSummary>();
  protected readonly confirmation = new FormControl('', { nonNullable: true });
  private readonly typed = toSignal(this.confirmation.valueChanges, { initialValue: '' });
  protected readonly matches = computed(() => this.typed() === this.project().name);
  protected readonly busy = signal(false);
  protected readonly error = signal('');

  protected async delete(): Promise<void> {
    if (!this.matches()) return;
    this.busy.set(true);
    this.error.set('');
    try {
      await firstValueFrom(this.api.delete(this.project().id, this.confirmation.value));
      await this.router.navigateByUrl('/projects');
    } catch (err) {
      this.error.set(apiErrorMessage(err));
    } finally {
      this.busy.set(false);
    }
  }
}
