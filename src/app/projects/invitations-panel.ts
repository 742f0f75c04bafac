import { DatePipe, TitleCasePipe } from '@angular/common';
import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, input, output, signal, viewChild } from '@angular/core';
import { FormBuilder, FormGroupDirective, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatListModule } from '@angular/material/list';
import { MatSelectModule } from '@angular/material/select';
import { firstValueFrom } from 'rxjs';
import { apiErrorMessage } from '../core/api-error';
import { pendingInvitationSchema, PROJECT_ROLES, type PendingInvitation, type ProjectRole } from '../../../shared/projects';
import { unwrapList } from '../core/api-envelope';
import { ROLE_MEANING } from './role-meaning';
import { ProjectsApi } from './projects-api';

/** Invite by e-mail with a role, and see or withdraw invitations not yet accepted (owners). */
@Component({
  selector: 'erg-invitations-panel',
  imports: [DatePipe, TitleCasePipe, ReactiveFormsModule, MatButtonModule, MatFormFieldModule, MatInputModule, MatListModule, MatSelectModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <form class="invite" [formGroup]="form" (ngSubmit)="invite()" novalidate aria-label="Invite someone">
      <mat-form-field class="email">
        <mat-label>E-mail to invite</mat-label>
        <input matInput type="email" formControlName="email" autocomplete="off" required>
        @if (form.controls.email.hasError('required')) { <mat-error>Enter an e-mail address.</mat-error> }
        @if (form.controls.email.hasError('email')) { <mat-error>This is not an e-mail address.</mat-error> }
      </mat-form-field>
      <mat-form-field class="role">
        <mat-label>Role</mat-label>
        <mat-select formControlName="role">
          @for (role of roles; track role) { <mat-option [value]="role">{{ role | titlecase }}</mat-option> }
        </mat-select>
        <mat-hint>{{ meaning[form.controls.role.value] }}</mat-hint>
      </mat-form-field>
      <button mat-flat-button type="submit" [disabled]="busy()">Send invitation</button>
    </form>
    @if (error()) { <p class="form-error" role="alert">{{ error() }}</p> }
    @if (sent()) { <p role="status" class="muted">{{ sent() }}</p> }

    <h3>Pending invitations</h3>
    @if (pending().length === 0) {
      <p class="muted">None waiting.</p>
    } @else {
      <mat-list role="list" aria-label="Pending invitations">
        @for (inv of pending(); track inv.id) {
          <mat-list-item role="listitem">
            <span matListItemTitle>{{ inv.email }} · {{ inv.role | titlecase }}</span>
            <span matListItemLine class="muted">Invited by {{ inv.invitedBy }}; expires {{ inv.expiresAt | date: 'medium' }}</span>
            <button matListItemMeta mat-button type="button" (click)="revoke(inv)" [attr.aria-label]="'Withdraw invitation to ' + inv.email">Withdraw</button>
          </mat-list-item>
        }
      </mat-list>
    }
  `,
  styles: `
    .invite { display: flex; gap: 12px; align-items: baseline; flex-wrap: wrap; }
    .email { flex: 2; min-width: 240px; }
    .role { flex: 1; min-width: 160px; }
  `,
})
export class InvitationsPanel {
  private readonly api = inject(ProjectsApi);
  /** After an invitation is sent or withdrawn, so the page can refresh what depends on it (the audit log). */
  readonly changed = output<void>();

  readonly projectId = input.required<number>();
  protected readonly roles = PROJECT_ROLES;
  protected readonly meaning = ROLE_MEANING;
  protected readonly invitations = httpResource(() => `/api/projects/${this.projectId()}/invitations`, { parse: unwrapList('invitations', pendingInvitationSchema) });
  protected readonly pending = computed(() => this.invitations.value() ?? []);
  private readonly formDirective = viewChild.required(FormGroupDirective);
  protected readonly busy = signal(false);
  protected readonly error = signal('');
  protected readonly sent = signal('');
  protected readonly form = inject(FormBuilder).nonNullable.group({
    email: ['', [Validators.required, Validators.email]],
    role: ['viewer' as ProjectRole, Validators.required],
  });

  protected async invite(): Promise<void> {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.busy.set(true);
    this.error.set('');
    this.sent.set('');
    try {
      const { email, role } = this.form.getRawValue();
      const invitation = await firstValueFrom(this.api.invite(this.projectId(), email.trim(), role));
      this.sent.set(`Invitation sent to ${invitation.email}.`);
      // Resetting through the directive also clears "submitted", so the empty field shows no error.
      this.formDirective().resetForm({ email: '', role });
      this.invitations.reload();
      this.changed.emit();
    } catch (err) {
      this.error.set(apiErrorMessage(err));
    } finally {
      this.busy.set(false);
    }
  }

  protected async revoke(invitation: PendingInvitation): Promise<void> {
    this.error.set('');
    try {
      await firstValueFrom(this.api.revokeInvitation(this.projectId(), invitation.id));
      this.invitations.reload();
      this.changed.emit();
    } catch (err) {
      this.error.set(apiErrorMessage(err));
    }
  }
}
