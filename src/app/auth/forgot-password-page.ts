import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { RouterLink } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { apiErrorMessage } from '../core/api-error';
import { AuthApi } from '../core/auth-api';

@Component({
  selector: 'erg-forgot-password-page',
  imports: [ReactiveFormsModule, RouterLink, MatCardModule, MatFormFieldModule, MatInputModule, MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="narrow">
      <mat-card appearance="outlined">
        <mat-card-header><h1 mat-card-title>Forgot your password?</h1></mat-card-header>
        <mat-card-content>
          @if (sent()) {
            <p role="status">{{ sent() }} The link works once, for an hour.</p>
          } @else {
            <p class="muted">Enter the e-mail of your account and we will send a link to choose a new password.</p>
            <form class="form-stack" [formGroup]="form" (ngSubmit)="send()" novalidate>
              <mat-form-field>
                <mat-label>E-mail</mat-label>
                <input matInput type="email" formControlName="email" autocomplete="email" required>
                @if (form.controls.email.hasError('required')) { <mat-error>Enter your e-mail address.</mat-error> }
                @if (form.controls.email.hasError('email')) { <mat-error>This is not an e-mail address.</mat-error> }
              </mat-form-field>
              @if (error()) { <p class="form-error" role="alert">{{ error() }}</p> }
              <div class="form-actions"><button mat-flat-button type="submit" [disabled]="busy()">Send reset link</button></div>
            </form>
          }
        </mat-card-content>
        <mat-card-actions><a mat-button routerLink="/sign-in">Back to sign in</a></mat-card-actions>
      </mat-card>
    </section>
  `,
})
export default class ForgotPasswordPage {
  private readonly api = inject(AuthApi);

  protected readonly busy = signal(false);
  protected readonly sent = signal('');
  protected readonly error = signal('');
  protected readonly form = inject(FormBuilder).nonNullable.group({ email: ['', [Validators.required, Validators.email]] });

  protected async send(): Promise<void> {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.busy.set(true);
    this.error.set('');
    try {
      const message = await firstValueFrom(this.api.requestPasswordReset(this.form.getRawValue().email));
      this.sent.set(message);
    } catch (err) {
      this.error.set(apiErrorMessage(err));
    } finally {
      this.busy.set(false);
    }
  }
}
