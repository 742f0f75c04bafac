import { HttpErrorResponse } from '@angular/common/http';
import { computed, inject, Injectable, signal } from '@angular/core';
import { firstValueFrom } from 'rxjs';
import { AuthApi } from './auth-api';
import type { SignedInUser } from '../../../shared/accounts';

/** Who is signed in, for the whole app; restored from the session cookie at start-up. */
@Injectable({ providedIn: 'root' })
export class AuthState {
  private readonly api = inject(AuthApi);
  private readonly current = signal<SignedInUser | null>(null);

  readonly user = this.current.asReadonly();
  readonly isSignedIn = computed(() => this.current() !== null);
  readonly isAdmin = computed(() => this.current()?.role === 'admin');

  /**
   * Asks the server who the session belongs to; null means nobody, an
   * ordinary answer rather than a failed request. If the server cannot be
   * asked, the app starts signed out and says why once, as a warning.
   */
  async restore(): Promise<void> {
    try {
      this.current.set(await firstValueFrom(this.api.session()));
    } catch (err) {
      console.warn('Ergodic could not ask the server who is signed in; starting signed out.', err instanceof HttpErrorResponse ? err.status : err);
      this.current.set(null);
    }
  }

  async signIn(email: string, password: string): Promise<void> {
    this.current.set(await firstValueFrom(this.api.signIn(email, password)));
  }

  async signUp(email: string, password: string, displayName: string): Promise<void> {
    this.current.set(await firstValueFrom(this.api.signUp(email, password, displayName)));
  }

  async resetPassword(token: string, password: string): Promise<void> {
    this.current.set(await firstValueFrom(this.api.confirmPasswordReset(token, password)));
  }

  async signOut(): Promise<void> {
    try {
      await firstValueFrom(this.api.signOut());
    } finally {
      this.current.set(null);
    }
  }

  /** Forgets the user after the server said the session is gone. */
  clear(): void {
    this.current.set(null);
  }
}
