import { ChangeDetectionStrategy, Component, inject, input, signal } from '@angular/core';
import { FormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { Router, RouterLink } from '@angular/router';
import { apiErrorMessage } from '../core/api-error';
import { AuthState } from '../core/auth-state';
import { safeReturnUrl } from '../core/safe-return-url';

@Component({
  selector: 'erg-sign-in-page',
  imports: [ReactiveFormsModule, RouterLink, MatCardModule, MatFormFieldModule, MatInputModule, MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="narrow">
      <mat-card appearance="outlined">
        <mat-card-header><h1 mat-card-title>Sign in</h1></mat-card-header>
        <mat-card-content>
          <form class="form-stack" [formGroup]="form" (ngSubmit)="signIn()" novalidate>
            <mat-form-field>
              <mat-label>E-mail</mat-label>
              <input matInput type="email" formControlName="email" autocomplete="email" required>
              @if (form.controls.email.hasError('required')) { <mat-error>Enter your e-mail address.</mat-error> }
              @if (form.controls.email.hasError('email')) { <mat-error>This is not an e-mail address.</mat-error> }
            </mat-form-field>
            <mat-form-field>
              <mat-label>Password</mat-label>
              <input matInput type="password" formControlName="password" autocomplete="current-password" required>
              @if (form.controls.password.hasError('required')) { <mat-error>Enter your password.</mat-error> }
            </mat-form-field>
            @if (error()) { <p class="form-error" role="alert">{{ error() }}</p> }
            <div class="form-actions">
              <button mat-flat-button type="submit" [disabled]="busy()">Sign in</button>
              <a mat-button routerLink="/forgot-password">Forgot your password?</a>
            </div>
          </form>
        </mat-card-content>
        <mat-card-actions>
          <span class="muted">New to Ergodic?</span>
          <a mat-button routerLink="/sign-up" [queryParams]="{ next: next() }">Create an account</a>
        </mat-card-actions>
      </mat-card>
    </section>
  `,
})
export default class SignInPage {
  private readonly auth = inject(AuthState);
  private readonly router = inject(Router);

  /** Where to go after signing in (from ?next=). */
  readonly next = input<string>();
  protected readonly busy = signal(false);
  protected readonly error = signal('');
  protected readonly form = inject(FormBuilder).nonNullable.group({
    email: ['', [Validators.required, Validators.email]],
    password: ['', Validators.required],
  });

  protected async signIn(): Promise<void> {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.busy.set(true);
    this.error.set('');
    try {
      const { email, password } = this.form.getRawValue();
      await this.auth.signIn(email, password);
      await this.router.navigateByUrl(safeReturnUrl(this.next()));
    } catch (err) {
      this.error.set(apiErrorMessage(err));
    } finally {
      this.busy.set(false);
    }
  }
}
