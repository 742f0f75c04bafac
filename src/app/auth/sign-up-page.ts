import { ChangeDetectionStrategy, Component, inject, input, OnInit, signal } from '@angular/core';
import { FormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { Router, RouterLink } from '@angular/router';
import { DISPLAY_NAME_MAX_LENGTH, PASSWORD_MAX_LENGTH, PASSWORD_MIN_LENGTH } from '../../../shared/account-rules';
import { apiErrorMessage } from '../core/api-error';
import { AuthState } from '../core/auth-state';
import { safeReturnUrl } from '../core/safe-return-url';

@Component({
  selector: 'erg-sign-up-page',
  imports: [ReactiveFormsModule, RouterLink, MatCardModule, MatFormFieldModule, MatInputModule, MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="narrow">
      <mat-card appearance="outlined">
        <mat-card-header><h1 mat-card-title>Create an account</h1></mat-card-header>
        <mat-card-content>
          <form class="form-stack" [formGroup]="form" (ngSubmit)="signUp()" novalidate>
            <mat-form-field>
              <mat-label>Your name</mat-label>
              <input matInput formControlName="displayName" autocomplete="name" required>
              <mat-hint>Shown to people you work with.</mat-hint>
              @if (form.controls.displayName.hasError('required')) { <mat-error>Enter the name your team knows you by.</mat-error> }
              @if (form.controls.displayName.hasError('maxlength')) { <mat-error>At most {{ nameMax }} characters.</mat-error> }
            </mat-form-field>
            <mat-form-field>
              <mat-label>E-mail</mat-label>
              <input matInput type="email" formControlName="email" autocomplete="email" required>
              @if (form.controls.email.hasError('required')) { <mat-error>Enter your e-mail address.</mat-error> }
              @if (form.controls.email.hasError('email')) { <mat-error>This is not an e-mail address.</mat-error> }
            </mat-form-field>
            <mat-form-field>
              <mat-label>Password</mat-label>
              <input matInput type="password" formControlName="password" autocomplete="new-password" required>
              <mat-hint>At least {{ passwordMin }} characters.</mat-hint>
              @if (form.controls.password.hasError('required')) { <mat-error>Choose a password.</mat-error> }
              @if (form.controls.password.hasError('minlength')) { <mat-error>At least {{ passwordMin }} characters.</mat-error> }
              @if (form.controls.password.hasError('maxlength')) { <mat-error>At most {{ passwordMax }} characters.</mat-error> }
            </mat-form-field>
            @if (error()) { <p class="form-error" role="alert">{{ error() }}</p> }
            <div class="form-actions">
              <button mat-flat-button type="submit" [disabled]="busy()">Create account</button>
            </div>
          </form>
        </mat-card-content>
        <mat-card-actions>
          <span class="muted">Already have an account?</span>
          <a mat-button routerLink="/sign-in" [queryParams]="{ next: next() }">Sign in</a>
        </mat-card-actions>
      </mat-card>
    </section>
  `,
})
export default class SignUpPage implements OnInit {
  private readonly auth = inject(AuthState);
  private readonly router = inject(Router);

  /** Where to go afterwards, e.g. back to an invitation. */
  readonly next = input<string>();
  /** Pre-filled from an invitation link. */
  readonly email = input<string>();
  protected readonly passwordMin = PASSWORD_MIN_LENGTH;
  protected readonly passwordMax = PASSWORD_MAX_LENGTH;
  protected readonly nameMax = DISPLAY_NAME_MAX_LENGTH;
  protected readonly busy = signal(false);
  protected readonly error = signal('');
  protected readonly form = inject(FormBuilder).nonNullable.group({
    displayName: ['', [Validators.required, Validators.maxLength(DISPLAY_NAME_MAX_LENGTH)]],
    email: ['', [Validators.required, Validators.email]],
    password: ['', [Validators.required, Validators.minLength(PASSWORD_MIN_LENGTH), Validators.maxLength(PASSWORD_MAX_LENGTH)]],
  });

  ngOnInit(): void {
    const invited = this.email();
    if (invited) this.form.controls.email.setValue(invited);
  }

  protected async signUp(): Promise<void> {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.busy.set(true);
    this.error.set('');
    try {
      const { email, password, displayName } = this.form.getRawValue();
      await this.auth.signUp(email, password, displayName);
      await this.router.navigateByUrl(safeReturnUrl(this.next()));
    } catch (err) {
      this.error.set(apiErrorMessage(err));
    } finally {
      this.busy.set(false);
    }
  }
}
