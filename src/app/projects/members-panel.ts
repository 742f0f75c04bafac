import { DatePipe, TitleCasePipe } from '@angular/common';
import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, input, output, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { MatSelectModule } from '@angular/material/select';
import { MatTableModule } from '@angular/material/table';
import { Router } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { AuthState } from '../core/auth-state';
import { confirmed } from '../shell/confirm-dialog';
import { apiErrorMessage } from '../core/api-error';
import { memberSchema, PROJECT_ROLES, type Member, type ProjectRole } from '../../../shared/projects';
import { unwrapList } from '../core/api-envelope';
import { ROLE_MEANING } from './role-meaning';
import { ProjectsApi } from './projects-api';
import { leaveBlockedReason } from './leave-rule';

/** Who is in the project; owners change roles and remove people here. */
@Component({
  selector: 'erg-members-panel',
  imports: [DatePipe, TitleCasePipe, MatButtonModule, MatProgressSpinnerModule, MatSelectModule, MatTableModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (error()) { <p class="form-error" role="alert">{{ error() }}</p> }
    @if (members.isLoading() && !members.hasValue()) {
      <div class="state"><mat-spinner diameter="24" aria-label="Loading members" /></div>
    } @else if (members.error()) {
      <p class="form-error" role="alert">{{ loadError() }}</p>
    } @else {
      <table mat-table class="cards-on-phone" [dataSource]="rows()" aria-label="Project members">
        <ng-container matColumnDef="name">
          <th mat-header-cell *matHeaderCellDef>Name</th>
          <td mat-cell *matCellDef="let m">{{ m.displayName }}<br><span class="muted">{{ m.email }}</span></td>
        </ng-container>
        <ng-container matColumnDef="role">
          <th mat-header-cell *matHeaderCellDef>Role</th>
          <td mat-cell *matCellDef="let m" data-label="Role">
            @if (canManage()) {
              <mat-select [value]="m.role" (selectionChange)="changeRole(m, $event.value)" [attr.aria-label]="'Role of ' + m.displayName">
                @for (role of roles; track role) { <mat-option [value]="role" [title]="meaning[role]">{{ role | titlecase }}</mat-option> }
              </mat-select>
            } @else {
              {{ m.role | titlecase }}
            }
          </td>
        </ng-container>
        <ng-container matColumnDef="joined">
          <th mat-header-cell *matHeaderCellDef>Joined</th>
          <td mat-cell *matCellDef="let m" data-label="Joined">{{ m.joinedAt | date: 'mediumDate' }}</td>
        </ng-container>
        <ng-container matColumnDef="actions">
          <th mat-header-cell *matHeaderCellDef><span class="visually-hidden">Actions</span></th>
          <td mat-cell *matCellDef="let m">
            @if (m.userId === auth.user()?.id) {
              @if (leaveBlocked(); as why) {
                <button mat-button type="button" disabled aria-label="Leave this project" aria-describedby="leave-blocked">Leave</button>
                <span id="leave-blocked" class="muted leave-hint">{{ why }}</span>
              } @else {
                <button mat-button type="button" (click)="remove(m)" aria-label="Leave this project">Leave</button>
              }
            } @else {
              <button mat-button type="button" (click)="remove(m)" [attr.aria-label]="'Remove ' + m.displayName">Remove</button>
            }
          </td>
        </ng-container>
        <tr mat-header-row *matHeaderRowDef="columns()"></tr>
        <tr mat-row *matRowDef="let row; columns: columns()"></tr>
      </table>
    }
  `,
  styles: `mat-select { max-width: 140px; } .leave-hint { display: block; max-width: 220px; font-size: 0.85em; }`,
})
export class MembersPanel {
  private readonly api = inject(ProjectsApi);
  protected readonly auth = inject(AuthState);
  private readonly dialog = inject(MatDialog);
  private readonly router = inject(Router);

  readonly projectId = input.required<number>();
  /** Owners may change roles and remove members. */
  readonly canManage = input(false);
  /** After a role change or a removal went through, so the page can refresh the audit log. */
  readonly changed = output<void>();
  protected readonly roles = PROJECT_ROLES;
  protected readonly meaning = ROLE_MEANING;
  protected readonly members = httpResource(() => `/api/projects/${this.projectId()}/members`, { parse: unwrapList('members', memberSchema) });
  protected readonly rows = computed(() => this.members.value() ?? []);
  protected readonly columns = computed(() => (this.canManage() ? ['name', 'role', 'joined', 'actions'] : ['name', 'role', 'joined']));
  protected readonly error = signal('');
  /** Why the signed-in owner may not leave (they are the only owner), or null. */
  protected readonly leaveBlocked = computed(() => leaveBlockedReason(this.rows(), this.auth.user()?.id));

  protected loadError(): string {
    return apiErrorMessage(this.members.error(), 'The members could not be loaded.');
  }

  protected async changeRole(member: Member, role: ProjectRole): Promise<void> {
    this.error.set('');
    try {
      await firstValueFrom(this.api.changeRole(this.projectId(), member.userId, role));
      this.changed.emit();
    } catch (err) {
      this.error.set(apiErrorMessage(err));
    }
    // Reloads either way, so a refused change shows the role that still holds.
    this.members.reload();
  }

  protected async remove(member: Member): Promise<void> {
    this.error.set('');
    const yourself = member.userId === this.auth.user()?.id;
    const sure = await confirmed(this.dialog, yourself
      ? {
          title: 'Leave this project?',
          message: 'You will no longer see its trajectories, reports or comments, and its access links stay as they are. Only an owner can add you again.',
          confirm: 'Leave the project', cancel: 'Stay',
        }
      : {
          title: `Remove ${member.displayName}?`,
          message: `${member.displayName} will no longer see this project's trajectories, reports or comments. You can invite them again later.`,
          confirm: 'Remove from project',
        });
    if (!sure) return;
    try {
      await firstValueFrom(this.api.removeMember(this.projectId(), member.userId));
      if (yourself) {
        await this.router.navigateByUrl('/projects');
        return;
      }
      this.members.reload();
      this.changed.emit();
    } catch (err) {
      this.error.set(apiErrorMessage(err));
    }
  }

  /** Lets the page refresh the list after an invitation is accepted elsewhere. */
  reload(): void {
    this.members.reload();
  }
}
