import { ChangeDetectionStrategy, Component, inject, input, signal } from '@angular/core';
import { FormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { Router, RouterLink } from '@angular/router';
import { PASSWORD_MAX_LENGTH, PASSWORD_MIN_LENGTH } from '../../../shared/account-rules';
import { apiErrorMessage } from '../core/api-error';
import { AuthState } from '../core/auth-state';

@Component({
  selector: 'erg-reset-password-page',
  imports: [ReactiveFormsModule, RouterLink, MatCardModule, MatFormFieldModule, MatInputModule, MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="narrow">
      <mat-card appearance="outlined">
        <mat-card-header><h1 mat-card-title>Choose a new password</h1></mat-card-header>
        <mat-card-content>
          @if (!token()) {
            <p class="form-error" role="alert">This page needs the link from the reset e-mail.</p>
          } @else {
            <form class="form-stack" [formGroup]="form" (ngSubmit)="reset()" novalidate>
              <mat-form-field>
                <mat-label>New password</mat-label>
                <input matInput type="password" formControlName="password" autocomplete="new-password" required>
                <mat-hint>At least {{ passwordMin }} characters.</mat-hint>
                @if (form.controls.password.hasError('required')) { <mat-error>Choose a password.</mat-error> }
                @if (form.controls.password.hasError('minlength')) { <mat-error>At least {{ passwordMin }} characters.</mat-error> }
                @if (form.controls.password.hasError('maxlength')) { <mat-error>At most {{ passwordMax }} characters.</mat-error> }
              </mat-form-field>
              @if (error()) { <p class="form-error" role="alert">{{ error() }}</p> }
              <div class="form-actions"><button mat-flat-button type="submit" [disabled]="busy()">Set password and sign in</button></div>
            </form>
          }
        </mat-card-content>
        <mat-card-actions><a mat-button routerLink="/forgot-password">Ask for a new link</a></mat-card-actions>
      </mat-card>
    </section>
  `,
})
export default class ResetPasswordPage {
  private readonly auth = inject(AuthState);
  private readonly router = inject(Router);

  /** From the e-mailed link's ?token=. */
  readonly token = input<string>();
  protected readonly passwordMin = PASSWORD_MIN_LENGTH;
  protected readonly passwordMax = PASSWORD_MAX_LENGTH;
  protected readonly busy = signal(false);
  protected readonly error = signal('');
  protected readonly form = inject(FormBuilder).nonNullable.group({
    password: ['', [Validators.required, Validators.minLength(PASSWORD_MIN_LENGTH), Validators.maxLength(PASSWORD_MAX_LENGTH)]],
  });

  protected async reset(): Promise<void> {
    const token = this.token();
    if (this.form.invalid || !token) {
      this.form.markAllAsTouched();
      return;
    }
    this.busy.set(true);
    this.error.set('');
    try {
      await this.auth.resetPassword(token, this.form.getRawValue().password);
      await this.router.navigateByUrl('/projects');
    } catch (err) {
      this.error.set(apiErrorMessage(err));
    } finally {
      this.busy.set(false);
    }
  }
}
