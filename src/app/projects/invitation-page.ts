import { DatePipe, TitleCasePipe } from '@angular/common';
import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { Router, RouterLink } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { apiErrorMessage } from '../core/api-error';
import { AuthState } from '../core/auth-state';
import { invitationFactsSchema } from '../../../shared/projects';
import { unwrap } from '../core/api-envelope';
import { ROLE_MEANING } from './role-meaning';
import { ProjectsApi } from './projects-api';

/** Where an invitation e-mail leads: explains the invitation, then signs in or up, then joins. */
@Component({
  selector: 'erg-invitation-page',
  imports: [DatePipe, TitleCasePipe, RouterLink, MatButtonModule, MatCardModule, MatIconModule, MatProgressSpinnerModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="narrow">
      @if (invitation.isLoading()) {
        <div class="state"><mat-spinner diameter="28" aria-label="Loading invitation" /></div>
      } @else if (invitation.error()) {
        <mat-card appearance="outlined">
          <mat-card-header><h1 mat-card-title>Invitation</h1></mat-card-header>
          <mat-card-content><p role="alert">{{ loadError() }}</p></mat-card-content>
          <mat-card-actions><a mat-button routerLink="/projects">Go to projects</a></mat-card-actions>
        </mat-card>
      } @else if (facts(); as f) {
        <mat-card appearance="outlined">
          <mat-card-header><h1 mat-card-title>Join “{{ f.projectName }}”</h1></mat-card-header>
          <mat-card-content>
            <p>{{ f.invitedBy }} invited <strong>{{ f.email }}</strong> to this project as {{ f.role === 'editor' ? 'an' : 'a' }} <strong>{{ f.role | titlecase }}</strong>: {{ meaning[f.role] }}.</p>
            <p class="muted">The invitation is valid until {{ f.expiresAt | date: 'medium' }}.</p>
            @if (auth.user(); as me) {
              @if (me.email !== f.email) {
                <p class="form-error" role="alert">You are signed in as {{ me.email }}. Sign out and use {{ f.email }} to accept.</p>
              }
            }
            @if (error()) { <p class="form-error" role="alert">{{ error() }}</p> }
          </mat-card-content>
          <mat-card-actions>
            @if (auth.isSignedIn()) {
              <button mat-flat-button type="button" (click)="accept()" [disabled]="busy()">Join project</button>
            } @else {
              <a mat-flat-button routerLink="/sign-up" [queryParams]="{ email: f.email, next: here() }">Create an account</a>
              <a mat-button routerLink="/sign-in" [queryParams]="{ next: here() }">I have an account</a>
            }
          </mat-card-actions>
        </mat-card>
      }
    </section>
  `,
})
export default class InvitationPage {
  protected readonly auth = inject(AuthState);
  private readonly api = inject(ProjectsApi);
  private readonly router = inject(Router);

  /** The :token route parameter from the e-mailed link. */
  readonly token = input.required<string>();
  protected readonly meaning = ROLE_MEANING;
  protected readonly invitation = httpResource(() => `/api/invitations/${encodeURIComponent(this.token())}`, { parse: unwrap('invitation', invitationFactsSchema) });
  protected readonly facts = computed(() => this.invitation.value() ?? null);
  protected readonly here = computed(() => `/invitations/${encodeURIComponent(this.token())}`);
  protected readonly busy = signal(false);
  protected readonly error = signal('');

  protected loadError(): string {
    return apiErrorMessage(this.invitation.error(), 'This invitation could not be loaded.');
  }

  protected async accept(): Promise<void> {
    this.busy.set(true);
    this.error.set('');
    try {
      const project = await firstValueFrom(this.api.acceptInvitation(this.token()));
      await this.router.navigate(['/projects', project.id]);
    } catch (err) {
      this.error.set(apiErrorMessage(err));
    } finally {
      this.busy.set(false);
    }
  }
}
